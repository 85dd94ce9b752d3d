"""Chi-square goodness of fit with pooling of small cells (common practice: Cochran's rule)."""
from __future__ import annotations

from typing import Dict, Hashable, Mapping

import numpy as np
from scipy import stats

#: p-value floor for every goodness-of-fit test: with fixed seeds a correct
#: sampler fails a given test with probability 1e-4 (false-alarm rate per test).
P_FLOOR = 1e-4


def pooled_chi_square(observed: Mapping[Hashable, int], probabilities: Dict[Hashable, float], n: int,
                      min_expected: float = 5.0) -> float:
    """p-value of observed counts against exact probabilities.

    States are sorted by expected count; those expected below ``min_expected``
    are merged into pools of at least that size. Observations outside the
    support make the p-value 0.
    """
    if any(state not in probabilities for state in observed):
        return 0.0
    states = sorted(probabilities, key=lambda s: probabilities[s])
    exp_cells, obs_cells = [], []
    pool_e = pool_o = 0.0
    for s in states:
        e = probabilities[s] * n
        o = observed.get(s, 0)
        if e < min_expected or pool_e > 0:
            pool_e += e
            pool_o += o
            if pool_e >= min_expected:
                exp_cells.append(pool_e)
                obs_cells.append(pool_o)
                pool_e = pool_o = 0.0
        else:
            exp_cells.append(e)
            obs_cells.append(o)
    if pool_e > 0:
        if exp_cells:
            exp_cells[-1] += pool_e
            obs_cells[-1] += pool_o
        else:
            exp_cells.append(pool_e)
            obs_cells.append(pool_o)
    if len(exp_cells) < 2:
        return 1.0
    exp = np.array(exp_cells)
    obs = np.array(obs_cells)
    return float(stats.chisquare(obs, exp * obs.sum() / exp.sum()).pvalue)
