"""The closed forms in one place (each lives with its plugin; re-exported here).

- ``macmahon(a, b, c)``: plane partitions in a box (MacMahon 1916; OEIS A008793)
- ``q_macmahon(a, b, c, q)``: its q-analogue, sum of q^volume
- ``volume_polynomial(a, b, c)``: the coefficients of that q-analogue
- ``aztec_count(n)``: 2^(n(n+1)/2) (Elkies, Kuperberg, Larsen, Propp 1992; OEIS A006125)
- ``rectangle_count(m, n)``: Kasteleyn (1961), Temperley-Fisher (1961); OEIS A004003 on squares
- ``asm_count(n)``: alternating sign matrices (Zeilberger 1996; Kuperberg 1996; OEIS A005130)
- ``izergin_korepin(n, a, b, c)``: six-vertex domain-wall partition function (Korepin 1982; Izergin 1987)
"""
from __future__ import annotations


def __getattr__(name: str):
    from ..registry import lattice

    table = {
        "macmahon": ("lozenge", "macmahon"), "volume_polynomial": ("lozenge", "volume_polynomial"),
        "q_macmahon": ("lozenge", "q_partition_function"),
        "aztec_count": ("domino", "aztec_count"), "rectangle_count": ("domino", "rectangle_count"),
        "asm_count": ("square_ice", "asm_count"), "izergin_korepin": ("square_ice", "izergin_korepin"),
    }
    if name not in table:
        raise AttributeError(name)
    plugin, attribute = table[name]
    module = lattice(plugin)
    if attribute == "q_partition_function":
        from ..lozenge.counts import q_partition_function

        return q_partition_function
    return getattr(module, attribute)


# names provided lazily by __getattr__ (each closed form lives with its plugin)
__all__ = ["asm_count", "aztec_count", "izergin_korepin", "macmahon", "q_macmahon", "rectangle_count", "volume_polynomial"]  # noqa: E501,F822
