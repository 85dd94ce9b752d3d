"""The package as downstream code sees it: imports, registry, typing files, pictures."""
import os
import subprocess
import sys
from pathlib import Path

import pytest

import frostline as fl


def test_import_works_without_matplotlib():
    # A meta-path hook makes any matplotlib import fail in a fresh interpreter.
    code = (
        "import sys\n"
        "class Block:\n"
        "    def find_spec(self, name, path=None, target=None):\n"
        "        if name.split('.')[0] == 'matplotlib': raise ImportError('blocked')\n"
        "sys.meta_path.insert(0, Block())\n"
        "import frostline as fl\n"
        "S = fl.lozenge.hexagon(3, 3, 3).sample(seed=1)\n"
        "assert S.tiles.shape == (27, 3)\n"
        "assert 'matplotlib' not in sys.modules\n"
        "print('ok')\n"
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert out.stdout.strip() == "ok"


def test_registry_lists_builtin_lattices():
    assert "lozenge" in fl.lattices()
    assert fl.lattice("lozenge") is fl.lozenge


def test_typing_files_are_shipped():
    root = Path(fl.__file__).parent
    assert (root / "py.typed").exists()
    assert (root / "_core.pyi").exists()


@pytest.mark.parametrize("ext", [".png", ".svg", ".pdf"])
def test_pictures_in_every_format(tmp_path, ext):
    S = fl.lozenge.hexagon(4, 3, 5).sample(seed=3)
    path = fl.plot.save(S, tmp_path / f"tiling{ext}", title="4x3x5")
    assert os.path.getsize(path) > 1000


def test_plot_draws_every_lozenge():
    import matplotlib

    matplotlib.use("Agg")
    S = fl.lozenge.hexagon(3, 4, 2).sample(seed=0)
    ax = S.plot()
    (collection,) = ax.collections
    assert len(collection.get_paths()) == len(S.tiles) == 3 * 4 + 4 * 2 + 2 * 3
