"""Run mypy on the package as it is installed: the source folders mapped by pyproject.

The lattices' Python faces live in plugins/<lattice>/<lattice>/ and are mapped
to frostline.<lattice> by [tool.scikit-build.wheel.packages]. mypy knows no
such mapping, so this script lays the same tree out with symbolic links in a
temporary folder and checks it with the [tool.mypy] settings of pyproject.toml.

    python tools/typecheck.py
"""
from __future__ import annotations

import subprocess
import sys
import tempfile
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]

if sys.version_info >= (3, 11):
    import tomllib
else:  # pragma: no cover
    import tomli as tomllib


def main() -> int:
    pyproject = tomllib.loads((ROOT / "pyproject.toml").read_text())
    table = pyproject["tool"]["scikit-build"]["wheel"]["packages"]
    with tempfile.TemporaryDirectory(prefix="frostline-typecheck-") as tmp:
        # shortest targets first, so "frostline" exists before "frostline/lozenge"
        for target, source in sorted(table.items(), key=lambda kv: kv[0].count("/")):
            place = Path(tmp) / target
            if place.parent != Path(tmp) and not place.parent.exists():
                raise SystemExit(f"{target}: its parent package is not mapped")
            if target.count("/") == 0:
                place.mkdir()
                for item in (ROOT / source).iterdir():
                    if item.name not in table.get(target, "") and item.name != "__pycache__":
                        (place / item.name).symlink_to(item)
                # the build generates this module from [project] version
                (place / "_version.py").write_text(f'__version__ = "{pyproject["project"]["version"]}"\n')
            else:
                place.symlink_to(ROOT / source, target_is_directory=True)
        return subprocess.call([sys.executable, "-m", "mypy", "--config-file", str(ROOT / "pyproject.toml"),
                                "-p", "frostline"], cwd=tmp)


if __name__ == "__main__":
    sys.exit(main())
