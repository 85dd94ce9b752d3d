"""The monotonicity checker enumerates each kind of site once (sites alike up to renaming their
neighbours get the identical check), so large regions are checked exhaustively and fast."""
import threading

import pytest

import frostline as fl


def test_large_weighted_ice_is_checked_whole_and_once_per_kind():
    region = fl.square_ice.domain_wall(100, 1.0, 1.2, 1.5)  # c >= max(a, b): monotone (docs/references.md section 5)
    report = fl.check_monotone(region)
    assert report.monotone and report.exhaustive and report.sites_checked == 99 * 99
    assert report.distinct_neighbourhoods < 50  # the interior is one kind; the rest lie next to the boundary


@pytest.mark.parametrize("weights", [(1.0, 2.0, 1.9), (3.0, 1.0, 1.0)])
def test_non_monotone_weights_are_still_found(weights):
    """c < max(a, b) is not monotone (derived in docs/references.md section 5; checked by enumeration at n = 4)."""
    assert not fl.check_monotone(fl.square_ice.domain_wall(30, *weights)).monotone


def test_a_check_of_no_site_is_refused():
    with pytest.raises(ValueError, match="max_sites"):
        fl.check_monotone(fl.square_ice.domain_wall(4, 1.0, 1.0, 1.5), max_sites=0)


def test_threads_share_one_exactness_check(monkeypatch):
    region = fl.square_ice.domain_wall(12, 1.0, 1.0, 1.5)
    calls = []
    real = type(region).exactness_check
    lock = threading.Lock()

    def counting(self):
        with lock:
            calls.append(1)
        return real(self)

    monkeypatch.setattr(type(region), "exactness_check", counting)
    region.samples(8, seed=1, threads=4)
    assert len(calls) == 1
