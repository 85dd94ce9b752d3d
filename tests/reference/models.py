"""Small hand-built height models for tests (independent of any plugin)."""
import numpy as np

import frostline as fl


def path_with_context_rule(table):
    """Three sites on a path between two boundary nodes at 0 (|steps| = 1, step 2), with a
    context rule: site 0 reads site 2, its chance of the higher value is table[bit] / 2^64."""
    rows = []
    chain = [3, 0, 1, 2, 4]
    for u, v in zip(chain, chain[1:]):
        rows += [(u, v, 1), (v, u, 1)]
    model = fl.HeightModel(3, np.array([0, 0]), np.array(rows), np.array([1, 0, 1]), 2, np.array([0, 1, 0]))
    rule = {"context_start": np.array([0, 1, 1, 2]), "context_nodes": np.array([2, 0]),
            "context_offset": np.array([0, 0, 0]), "context_table": np.array(table, np.uint64)}
    return model, rule
