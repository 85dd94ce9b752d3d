"""Large tilings are drawn as one image: every pixel shows the tile under it (common practice for big pictures)."""
from __future__ import annotations

import numpy as np
import pytest

import frostline as fl
from frostline.domino.drawing import raster_dominoes
from frostline.lozenge.drawing import raster_lozenges
from frostline.lozenge.tiles import DOWN_PARTNER, plane_points
from frostline.toolkit import palette
from frostline.toolkit.drawing import hex_to_rgb


def _pixel(image, extent, point):
    x0, x1, y0, y1 = extent
    h, w, _ = image.shape
    return image[int((y1 - point[1]) / (y1 - y0) * h), int((point[0] - x0) / (x1 - x0) * w)]


@pytest.mark.parametrize("seed", [0, 1])
def test_lozenge_raster_shows_the_lozenge_of_every_triangle(seed):
    tiles = fl.lozenge.hexagon(6, 5, 4).sample(seed=seed).tiles
    image, extent = raster_lozenges(tiles, pixels=600, oversample=1)
    for x, y, t in tiles:
        colour = hex_to_rgb(palette.LOZENGE_FACES[t])
        dx, dy = DOWN_PARTNER[t]
        up_centre = plane_points(np.array([x + 1 / 3, y + 1 / 3]))
        down_centre = plane_points(np.array([x + dx + 2 / 3, y + dy + 2 / 3]))
        assert np.allclose(_pixel(image, extent, up_centre)[:3], colour)
        assert np.allclose(_pixel(image, extent, down_centre)[:3], colour)
    assert _pixel(image, extent, (extent[0] + 1e-3, extent[3] - 1e-3))[3] == 0.0   # outside: transparent


def test_domino_raster_is_one_pixel_per_cell():
    region = fl.domino.aztec_diamond(6)
    tiles = region.sample(seed=3).tiles
    classes = region.classify(tiles)
    image, extent = raster_dominoes(tiles, classes)
    assert image.shape[:2] == region.mask.shape
    for (cells, k) in zip(tiles, classes):
        for r, c in cells:
            assert np.allclose(image[r, c, :3], hex_to_rgb(palette.DOMINO_CLASSES[k]))
    assert (image[..., 3] > 0).sum() == region.mask.sum()
    assert extent == (0.0, 12.0, -12.0, 0.0)


def test_big_pictures_use_the_raster(tmp_path, monkeypatch):
    import frostline.domino.drawing as dd
    import frostline.lozenge.drawing as ld
    monkeypatch.setattr(ld, "RASTER_TILES", 10)
    monkeypatch.setattr(dd, "RASTER_TILES", 10)
    for region in (fl.lozenge.hexagon(5, 5, 5), fl.domino.aztec_diamond(5)):
        path = tmp_path / f"{region.lattice}.png"
        fl.plot.save(region.sample(seed=0), path)
        assert path.stat().st_size > 2000


@pytest.mark.parametrize("region", [fl.lozenge.hexagon_region(3, 2, 2), fl.domino.aztec_diamond(3)])
def test_tile_outlines_surround_the_tile_centres(region):
    tiles = region.sample(seed=2).tiles
    outlines = region.tile_outlines(tiles)
    assert np.allclose(outlines.mean(axis=1), region.tile_centres(tiles))


def test_lozenge_raster_is_bounded_and_independent_of_tile_order():
    tiles = fl.lozenge.tiles_of_plane_partition(np.zeros((40, 30), dtype=int), 20)
    shuffled = tiles[np.random.default_rng(0).permutation(len(tiles))]
    first, extent = raster_lozenges(tiles, pixels=300)
    second, extent2 = raster_lozenges(shuffled, pixels=300)
    assert extent == extent2 and np.array_equal(first, second)
    assert max(first.shape[:2]) == 300
    # partly covered pixels keep the tone of what covers them (no fading towards white)
    partial = (first[..., 3] > 0) & (first[..., 3] < 1)
    tones = np.array([hex_to_rgb(c) for c in palette.LOZENGE_FACES])
    nearest = np.min(np.abs(first[partial][:, None, :3] - tones[None]).sum(axis=2), axis=1)
    assert partial.any() and np.median(nearest) < 1e-6
    # a long thin column of lozenges: the picture stays pixels long, whatever the bounding box
    k = np.arange(100000)
    image, _ = raster_lozenges(np.stack([-k, 2 * k, np.ones_like(k)], axis=1), pixels=500)
    assert max(image.shape[:2]) == 500


@pytest.mark.parametrize("bad", [{"pixels": 0}, {"pixels": 10**6}, {"pixels": 2.5}, {"oversample": 0}])
def test_raster_sizes_are_checked(bad):
    tiles = fl.lozenge.hexagon(2, 2, 2).sample(seed=0).tiles
    with pytest.raises(ValueError, match="pixels|oversample"):
        raster_lozenges(tiles, **bad)


def test_density_panels_are_titled_in_words(tmp_path, monkeypatch):
    from matplotlib.axes import Axes

    titles = []
    real = Axes.set_title
    monkeypatch.setattr(Axes, "set_title", lambda self, label, *a, **k: (titles.append(label), real(self, label, *a, **k))[1])
    region = fl.lozenge.hexagon(3, 3, 3)
    fl.plot.save_densities(fl.exact.class_densities(region), tmp_path / "d.png", labels=region.tile_class_labels)
    assert titles == ["type 0: cube tops", "type 1: faces along +X", "type 2: faces along -Y"]
