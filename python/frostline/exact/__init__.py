"""Exact methods for any lattice: enumeration of tiny regions, exact determinants, local statistics.

- ``enumerate(region)``: every configuration (height arrays), from the generic model
- ``distribution(region)``: configurations with exact probabilities under the region's weights
- ``integer_determinant(matrix)``: exact determinants (modular, banded elimination)
- ``placement_probabilities(region)``: (tiles, p) from the inverse Kasteleyn matrix
- ``mean_heights(region)``: the exact expected height at every point
- ``class_densities(region)``: the same grouped by tile class, with tile centres
- ``log_partition_function(region)``: log of the (weighted) tiling count with a checked error bound
- ``certified_log_abs_det(matrix)``: log abs(det) with its bound (float, exact integers or intervals)
- ``formulas``: the closed forms (MacMahon, Aztec, rectangles, ASM, Izergin-Korepin)
"""
from . import formulas
from .certified import CertifiedLog, certified_log_abs_det
from .determinant import integer_determinant
from .enumeration import EnumerationTooLarge, distribution, enumerate_configurations, enumerate_heights
from .local_statistics import (
                               class_densities,
                               log_partition_function,
                               log_partition_function_bound,
                               mean_heights,
                               placement_probabilities,
)

enumerate = enumerate_configurations  # noqa: A001 - the public name of the contract (fl.exact.enumerate)

__all__ = ["CertifiedLog", "EnumerationTooLarge", "certified_log_abs_det", "class_densities", "distribution", "enumerate", "enumerate_configurations",
           "enumerate_heights", "formulas", "integer_determinant", "log_partition_function", "log_partition_function_bound",
           "mean_heights", "placement_probabilities"]
