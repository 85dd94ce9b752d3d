"""Our colours are defined once and readable by colour-blind readers.

Every two colours of every palette differ by CIE76 Delta E >= 20 in normal
vision and under simulated protanopia, deuteranopia and tritanopia (Machado,
Oliveira, Fernandes, IEEE TVCG 15, 2009; tests/reference/colour_vision.py).
The package writes no colour literal outside frostline/toolkit/palette.py.
"""
from __future__ import annotations

import re
from pathlib import Path

import pytest
from reference.colour_vision import smallest_difference

from frostline.toolkit import palette

ROOT = Path(__file__).resolve().parents[1]


@pytest.mark.parametrize("name", sorted(palette.PALETTES))
def test_every_pair_differs_in_every_vision(name):
    assert smallest_difference(palette.PALETTES[name]) >= 20


def test_the_test_can_fail():
    # the square-ice tones before this palette: a2 against b2 under protanopia was about 10
    assert smallest_difference(("#7fa86a", "#c8ddb0", "#d69a3c", "#f1d39a", "#2c3e57", "#c2566b")) < 20


def test_ice_pairs_differ_in_lightness():
    from reference.colour_vision import lab

    tones = palette.ICE_VERTEX_TYPES
    for first, second in zip(tones[0::2], tones[1::2]):
        assert abs(lab(first)[0] - lab(second)[0]) >= 10


def test_no_colour_literals_outside_the_palette():
    literal = re.compile(r"[\"']#[0-9a-fA-F]{6}[\"']")
    offenders = []
    for folder in ("python", "plugins", "examples"):
        for path in (ROOT / folder).rglob("*.py"):
            if path.name == "palette.py":
                continue
            if literal.search(path.read_text()):
                offenders.append(str(path.relative_to(ROOT)))
    assert offenders == []
