"""The face colouring of domino pictures: eight tones that show the gas phase of two-periodic weights."""
from __future__ import annotations

import numpy as np
import pytest

import frostline as fl
from frostline.domino.weights import face_parity
from frostline.toolkit import palette


def _positions(mask):
    rows, cols = np.nonzero(mask[:, :-1] & mask[:, 1:])
    horizontal = np.stack([np.stack([rows, cols], 1), np.stack([rows, cols + 1], 1)], 1)
    rows, cols = np.nonzero(mask[:-1] & mask[1:])
    vertical = np.stack([np.stack([rows, cols], 1), np.stack([rows + 1, cols], 1)], 1)
    return horizontal, vertical


@pytest.mark.parametrize("n", [3, 4, 7])
def test_face_parity_is_the_face_of_the_two_periodic_weights(n):
    region = fl.domino.aztec_diamond(n, two_periodic_weights=(1.0, 0.25))
    weight_h, weight_v = region.weights
    horizontal, vertical = _positions(region.mask)
    for tiles, weights in ((horizontal, weight_h[horizontal[:, 0, 0], horizontal[:, 0, 1]]),
                           (vertical, weight_v[vertical[:, 0, 0], vertical[:, 0, 1]])):
        assert np.array_equal(np.where(face_parity(tiles) == 0, 1.0, 0.25), weights)


def test_the_gas_phase_has_few_odd_face_dominoes():
    # A gas phase in the middle of the two-periodic Aztec diamond, surrounded by liquid (Chhita, Johansson,
    # Adv. Math. 294, 2016): the face colouring must tell the two apart. On exact placement probabilities (no
    # sampling noise), order 80, weights (1, 0.3), the odd-face share is 0.044 in the middle and 0.14-0.21 in
    # the liquid band; the thresholds are those measured values with margin (a regression check of ours,
    # not published numbers).
    n = 80
    region = fl.domino.aztec_diamond(n, two_periodic_weights=(1.0, 0.3))
    tiles, p = fl.exact.placement_probabilities(region)
    tiles = np.asarray(tiles).reshape(-1, 2, 2)
    odd = face_parity(tiles) == 1
    centre = tiles.mean(axis=1) - n + 0.5
    radius = np.hypot(centre[:, 0] + centre[:, 1], centre[:, 0] - centre[:, 1]) / n

    def share(lo, hi):
        band = (radius >= lo) & (radius < hi)
        return p[band & odd].sum() / p[band].sum()

    assert share(0.0, 0.3) < 0.06
    assert share(0.55, 0.75) > 2.5 * share(0.0, 0.3)


def test_pictures_use_the_face_colouring_for_two_periodic_weights(tmp_path, monkeypatch):
    pytest.importorskip("matplotlib")
    import frostline.domino.drawing as drawing

    seen = {}
    real = drawing.draw_dominoes

    def spy(tiles, classes, ax=None, **style):
        seen["classes"], seen["tones"] = np.asarray(classes), style.get("tones")
        return real(tiles, classes, ax=ax, **style)

    monkeypatch.setattr(drawing, "draw_dominoes", spy)
    gas = fl.domino.aztec_diamond(6, two_periodic_weights=(1.0, 0.3)).sample(seed=1)
    fl.plot.save(gas, tmp_path / "gas.png")
    assert seen["tones"] == palette.DOMINO_CLASSES_BY_FACE and seen["classes"].max() >= 4
    fl.plot.save(gas, tmp_path / "four.png", colouring="classes")
    assert seen["tones"] is None and seen["classes"].max() <= 3
    uniform = fl.domino.aztec_diamond(6).sample(seed=1)
    fl.plot.save(uniform, tmp_path / "uniform.png", colouring="faces")
    assert seen["classes"].max() >= 4
    with pytest.raises(ValueError, match="colouring must be"):
        fl.plot.save(uniform, tmp_path / "bad.png", colouring="parity")


def test_command_line_colouring(tmp_path, capsys):
    pytest.importorskip("matplotlib")
    from frostline.cli import main

    assert main(["sample", "aztec", "8", "--colouring", "faces", "--seed", "1",
                 "--picture", str(tmp_path / "a.png")]) == 0
    assert (tmp_path / "a.png").stat().st_size > 1000
