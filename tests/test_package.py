"""The package as downstream code sees it: imports, registry, typing files, pictures."""
import os
import subprocess
import sys
from pathlib import Path

import numpy as np
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


def _pixel_colours(sample, points):
    """RGB (0..1) of the rendered picture at plane points (data coordinates)."""
    import matplotlib

    matplotlib.use("Agg")
    import matplotlib.pyplot as plt
    from matplotlib.colors import to_rgb

    fig, ax = plt.subplots(figsize=(4, 4), dpi=100)
    sample.plot(ax=ax)
    fig.canvas.draw()
    image = np.asarray(fig.canvas.buffer_rgba())[:, :, :3] / 255.0
    height = image.shape[0]
    pixels = ax.transData.transform(points)
    out = [image[int(round(height - y)), int(round(x))] for x, y in pixels]
    plt.close(fig)
    return np.array(out), to_rgb


@pytest.mark.parametrize("make, tones_of", [
    (lambda: fl.lozenge.hexagon(2, 3, 2).sample(seed=1), "lozenge"),
    (lambda: fl.domino.aztec_diamond(3).sample(seed=2), "domino"),
])
def test_pictures_show_each_tile_in_its_class_colour(make, tones_of):
    """The pixel at the centre of every tile has the colour of that tile's class (picture content, not size)."""
    S = make()
    R = S.region
    if tones_of == "lozenge":
        from frostline.lozenge.drawing import FACE_TONES as tones
        centres = R.tile_centres(S.tiles)
    else:
        from frostline.domino.drawing import CLASS_TONES as tones
        t = np.asarray(S.tiles, dtype=float)
        centres = np.stack([t[:, :, 1].mean(axis=1) + 0.5, -(t[:, :, 0].mean(axis=1) + 0.5)], axis=1)
    colours, to_rgb = _pixel_colours(S, centres)
    expected = np.array([to_rgb(tones[k]) for k in R.classify(S.tiles)])
    assert np.abs(colours - expected).max() < 0.02
