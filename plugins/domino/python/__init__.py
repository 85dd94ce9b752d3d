"""Domino tilings of the square grid (built-in plugin ``domino``)."""
