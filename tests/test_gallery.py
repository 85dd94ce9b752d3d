"""The gallery scripts (examples/gallery) run in their small mode, as the documentation build runs them."""
from __future__ import annotations

import os
import runpy
from pathlib import Path

import pytest

GALLERY = Path(__file__).resolve().parents[1] / "examples" / "gallery"


@pytest.mark.parametrize("script", sorted(p.name for p in GALLERY.glob("plot_*.py")))
def test_gallery_script_runs_small(script, monkeypatch):
    import matplotlib

    matplotlib.use("Agg")
    import matplotlib.pyplot as plt

    monkeypatch.setenv("FROSTLINE_GALLERY_SMALL", "1")
    try:
        runpy.run_path(str(GALLERY / script), run_name="__main__")
        assert plt.get_fignums(), f"{script} drew no figure"
    finally:
        plt.close("all")
    assert os.environ["FROSTLINE_GALLERY_SMALL"] == "1"
