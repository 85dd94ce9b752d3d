"""Exact methods usable with any lattice: integer determinants, enumeration of tiny regions."""
from .determinant import integer_determinant
from .enumeration import EnumerationTooLarge, enumerate_heights

__all__ = ["EnumerationTooLarge", "enumerate_heights", "integer_determinant"]
