"""Print the requirements of one optional extra of pyproject.toml, one per line (for pip install -r).

Usage: python tools/extra_requirements.py docs > requirements.txt
"""
from __future__ import annotations

import sys
from pathlib import Path

try:
    import tomllib
except ImportError:  # Python 3.10 and older: pip carries the same parser
    from pip._vendor import tomli as tomllib  # type: ignore[no-redef]


def main() -> None:
    if len(sys.argv) != 2:
        sys.exit("usage: python tools/extra_requirements.py EXTRA")
    table = tomllib.loads((Path(__file__).resolve().parents[1] / "pyproject.toml").read_text())
    extras = table["project"]["optional-dependencies"]
    if sys.argv[1] not in extras:
        sys.exit(f"no extra {sys.argv[1]!r}; pyproject.toml has {', '.join(sorted(extras))}")
    print("\n".join(extras[sys.argv[1]]))


if __name__ == "__main__":
    main()
