"""frostline's colours, defined once; every picture of the package takes its colours from here.

Chosen by us for print and for colour-blind readers: within each palette
every two colours differ by CIE76 Delta E >= 20 in normal vision and under
simulated protanopia, deuteranopia and tritanopia (tests/test_palette.py,
with the simulation of Machado, Oliveira and Fernandes, 2009). The pairs of
the square-ice palette also differ in lightness, so they survive greyscale.
"""
from __future__ import annotations

#: lozenge faces: cube tops pale, the two visible sides in two darker tones
LOZENGE_FACES = ("#f1e4c3", "#b5774a", "#5b3a2e")
#: outlines of small lozenge pictures
LOZENGE_INK = "#2b1d17"

#: domino classes north, south, east, west: two warm tones for horizontal, two cool for vertical
DOMINO_CLASSES = ("#d9a441", "#8c4a2f", "#3f6e8c", "#9cc3c9")
#: the same four classes split by face parity (the two face kinds of two-periodic weights, which show the
#: gas phase): even faces in the tones above, odd faces in a partner tone of each
DOMINO_CLASSES_BY_FACE = DOMINO_CLASSES + ("#f8d298", "#c94000", "#24a3de", "#818889")
#: outlines of small domino pictures
DOMINO_INK = "#1f1a17"

#: square-ice vertex types a1, a2, b1, b2, c1, c2: a ochre and olive grey, b sky and indigo, c ink and pale
ICE_VERTEX_TYPES = ("#d7a348", "#8a8978", "#47a2d0", "#4136a8", "#3c272c", "#dfe8d7")

#: a measured curve (frozen boundary of a sample) and the theory curve beside it
MEASURED = "#c2412f"
THEORY = "#5a3cc8"
#: a curve predicted by frostline's own solver (the variational principle), beside the other two
PREDICTED = "#e8c547"

#: up to four series on a white background (examples, comparisons across a parameter)
SERIES = ("#3c272c", "#47a2d0", "#d7a348", "#4136a8")

PALETTES = {"lozenge faces": LOZENGE_FACES, "domino classes": DOMINO_CLASSES,
            "domino classes by face": DOMINO_CLASSES_BY_FACE, "ice vertex types": ICE_VERTEX_TYPES,
            "curves": (MEASURED, THEORY, PREDICTED), "series": SERIES}
