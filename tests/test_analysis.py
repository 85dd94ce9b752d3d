"""Arctic phenomena: theory curves, empirical frozen boundaries, densities and height fluctuations."""
import math

import numpy as np
import pytest

import frostline as fl
from frostline.analysis import curve_distance, density_grid, frozen_boundary, local_densities, variance_at


def hexagon_corners(a, b, c):
    s3 = math.sqrt(3)
    return np.array([(0, 0), (a, 0), (a + b / 2, s3 * b / 2), (a + b / 2 - c / 2, s3 * (b + c) / 2),
                     (b / 2 - c / 2, s3 * (b + c) / 2), (-c / 2, s3 * c / 2)])


@pytest.mark.parametrize("sides", [(1, 1, 1), (5, 3, 4), (2, 7, 3), (6, 6, 2)])
def test_hexagon_ellipse_is_tangent_to_every_side_where_predicted(sides):
    # Cohn, Larsen, Propp 1998; touching points from docs/references.md section 2: an a-side is touched
    # at distance ac/(b+c) from its end that meets a c-side (cyclically for b- and c-sides).
    a, b, c = sides
    curve = fl.lozenge.hexagon(a, b, c).arctic_curve(m=40000)
    v = hexagon_corners(a, b, c)
    lengths = [a, b, c, a, b, c]
    touch = [a * c / (b + c), b * a / (c + a), c * b / (a + b)] * 2   # from the side's first corner
    for k in range(6):
        p, q = v[k], v[(k + 1) % 6]
        d = (q - p) / np.linalg.norm(q - p)
        normal = np.array([-d[1], d[0]])  # pointing into the hexagon (counter-clockwise corners)
        signed = (curve - p) @ normal
        assert signed.min() > -1e-9 * max(sides)          # never outside the side
        assert signed.min() < 1e-5 * max(sides)           # touches it
        where = (curve[np.argmin(signed)] - p) @ d
        assert where == pytest.approx(touch[k], abs=2e-3 * lengths[k])


def test_regular_hexagon_ellipse_is_the_inscribed_circle():
    # a = b = c = 1: (X - 1/2)^2 + (Y - sqrt3/2)^2 = 3/4 (docs/references.md section 2)
    c = fl.lozenge.hexagon(1, 1, 1).arctic_curve()
    assert np.allclose(np.hypot(c[:, 0] - 0.5, c[:, 1] - math.sqrt(3) / 2), math.sqrt(0.75))


def test_aztec_curves_are_tangent_to_the_sides():
    # Jockusch, Propp, Shor 1998: the circle x^2 + y^2 = n^2/2 touches |x| + |y| = n at the midpoints;
    # the biased ellipse x^2/A + y^2/B = n^2 with A + B = 1 touches the sides too.
    for a in (1.0, 2.0, 0.5):
        curve = fl.domino.aztec_diamond(10, vertical_weight=a).arctic_curve(m=40000) / 10
        l1 = np.abs(curve).sum(axis=1)
        assert l1.max() == pytest.approx(1.0, abs=1e-6) and np.all(l1 <= 1 + 1e-9)


@pytest.mark.parametrize("weights", [(1, 1, 1), (1, 1, math.sqrt(2)), (1, 2, math.sqrt(5)), (2, 1, math.sqrt(5))])
def test_square_ice_curves_touch_each_side_once(weights):
    n = 10
    curve = fl.square_ice.domain_wall(n, *weights).arctic_curve(m=40000) / n
    assert curve.min() > -1e-9 and curve.max() < 1 + 1e-9
    for axis, value in ((0, 0.0), (0, 1.0), (1, 0.0), (1, 1.0)):
        assert np.abs(curve[:, axis] - value).min() < 1e-4


def test_asm_curve_crosses_the_diagonal_where_derived():
    # docs/references.md section 2 [derived by the tangent method]: the NW arc crosses the corner's
    # diagonal at distance 1 - sqrt(3)/2 from each side.
    curve = fl.square_ice.domain_wall(1).arctic_curve(m=80000)
    nw = curve[(curve[:, 0] < 0.5) & (curve[:, 1] > 0.5)]
    on_diagonal = nw[np.argmin(np.abs(nw[:, 0] - (1 - nw[:, 1])))]
    assert on_diagonal[0] == pytest.approx(1 - math.sqrt(3) / 2, abs=1e-3)


def test_no_curve_where_none_is_published():
    for region in (fl.lozenge.hexagon(4, 4, 4, q=0.9), fl.domino.from_picture("####\n####\n"),
                   fl.domino.aztec_diamond(6, two_periodic_weights=(1, 0.5)), fl.square_ice.domain_wall(5, 1, 1, 1.5),
                   fl.lozenge.trapezoid(5, 3)):
        with pytest.raises(ValueError, match="no"):
            region.arctic_curve()


def distance(region, seed=1):
    grid = density_grid(region.sample(seed=seed), bin_size=0.5, smoothing=2.0)
    return curve_distance(frozen_boundary(grid, 0.1, scale=region.scale), region.arctic_curve() / region.scale)


@pytest.mark.parametrize("make, bound", [(lambda n: fl.lozenge.hexagon(n, n, n), 0.3),
                                         (lambda n: fl.domino.aztec_diamond(n), 0.12),
                                         (lambda n: fl.domino.aztec_diamond(n, vertical_weight=2.0), 0.15)])
def test_empirical_boundaries_converge_to_theory(make, bound):
    # Fixed seeds; the largest distance (scaled units) shrinks with size. It is dominated by the
    # thin frozen strips near the tangency points, which a window of 2 lattice units cannot see,
    # so it decays like n^(-1/2); the bounds at the largest size leave ~40% headroom (measured).
    d = [distance(make(n)) for n in (20, 40, 80)]
    assert d[0] > d[1] > d[2] and d[2] < bound


def test_free_fermion_ice_boundary_is_the_biased_aztec_ellipse():
    # docs/references.md section 2: at c^2 = a^2 + b^2 the curve is an ellipse; compare at a != b
    d = [distance(fl.square_ice.domain_wall(n, 1, 2, math.sqrt(5))) for n in (24, 72)]
    assert d[1] < d[0] and d[1] < 0.4


def test_uniform_asm_boundary_against_the_derived_curve():
    # The explicit Delta = 1/2 curve in docs/references.md is derived by the tangent method, not quoted:
    # samples test it. At n = 90 the distance is of the size seen for the lozenge ellipse.
    assert distance(fl.square_ice.domain_wall(90)) < 0.3


@pytest.mark.parametrize("make, centre, value", [
    (lambda: fl.lozenge.hexagon(30, 30, 30), (15.0, 15 * math.sqrt(3)), 1 / 3),
    (lambda: fl.domino.aztec_diamond(30), (0.0, 0.0), 1 / 4),
])
def test_centre_densities_from_samples(make, centre, value):
    # 60 exact samples; each class density within 4 standard errors (from the sample variance)
    # plus 0.01 for finite size (exact values at these sizes differ from the limit by < 0.01).
    samples = make().samples(60, seed=7)
    for name, (mean, se) in local_densities(samples, centre, radius=4.0).items():
        assert abs(mean - value) < 4 * se + 0.01, name


def n_statistic(pp):
    """N = #{k = 1..n : pi[k-1, k-1] >= k} (docs/references.md section 4, plane-partition convention)."""
    n = pp.shape[0]
    return sum(int(pp[k - 1, k - 1] >= k) for k in range(1, n + 1))


@pytest.mark.parametrize("n, exact", [(4, 0.156463), (8, 0.209736), (16, 0.257359)])
def test_height_fluctuation_statistic_matches_the_exact_table(n, exact):
    # docs/references.md section 4 [checked with an exact kernel computation]. 3000 samples; the
    # sample variance has standard error about var * sqrt(2 / K) (normal approximation; N is
    # nearly normal here); tolerance 4 standard errors.
    samples = fl.lozenge.hexagon(n, n, n).samples(3000, seed=n)
    values = np.array([n_statistic(s.heights) for s in samples])
    var = values.var(ddof=1)
    assert abs(var - exact) < 4 * exact * math.sqrt(2 / (len(values) - 1))


def test_centre_variance_grows_like_log_n():
    # Kenyon (2001, 2008): height fluctuations are logarithmic. The centre statistic N of
    # docs/references.md section 4 (exact table: 0.156463, 0.209736, 0.257359 at n = 4, 8, 16) gains a
    # nearly constant amount per doubling, 0.0533 then 0.0476; a power law n^p would multiply it
    # instead. Fit Var N = A + B ln n on 2500 samples per size: B must be within 35% of the
    # table's slope 0.0728 (standard error of B here is about 0.007, so this is a 3.5-sigma band).
    sizes = (4, 8, 16)
    var = []
    for n in sizes:
        values = [n_statistic(s.heights) for s in fl.lozenge.hexagon(n, n, n).samples(2500, seed=300 + n)]
        var.append(float(np.var(values, ddof=1)))
    slope, _ = np.polyfit(np.log(sizes), var, 1)
    assert abs(slope - 0.0728) < 0.35 * 0.0728
    # and the relative growth per doubling shrinks (it would stay fixed for a power law)
    assert var[2] / var[1] < var[1] / var[0] + 0.1


def test_variance_at_points():
    samples = fl.lozenge.hexagon(3, 3, 3).samples(50, seed=1)
    v = variance_at(samples, [(0, 0), (2, 2), (1, 1)])
    assert v.shape == (3,) and np.all(v >= 0) and v[2] > 0


def test_density_grid_and_boundary_arguments():
    S = fl.domino.aztec_diamond(10).sample(seed=0)
    with pytest.raises(ValueError):
        density_grid(S, bin_size=0)
    with pytest.raises(ValueError):
        density_grid([], bin_size=1)
    with pytest.raises(ValueError, match="empty"):
        curve_distance([], np.zeros((3, 2)))


def test_sides_on_the_bounding_box_count_as_edge():
    """A hexagon's top and bottom sides and every side of the square-ice domain lie on the grid's
    bounding box; points next to them are edge points too (they were missed before)."""
    from frostline.analysis.boundary import near_edge

    for region, inside, on_box in [
        (fl.lozenge.hexagon(20, 20, 20), (0.5, np.sqrt(3) / 2), [(0.5, 0.02), (0.5, np.sqrt(3) - 0.02)]),
        (fl.square_ice.domain_wall(30), (0.5, 0.5), [(0.5, 0.01), (0.01, 0.5), (0.99, 0.5), (0.5, 0.99)]),
    ]:
        grid = density_grid(region.sample(seed=0), bin_size=0.5, smoothing=1.0)
        mask = near_edge(grid, 0.05, scale=region.scale)
        assert not mask(np.array([inside]))[0]
        assert mask(np.array(on_box)).all()


def test_excluding_points_never_increases_the_distance():
    theory = np.stack([np.cos(np.linspace(0, 2 * np.pi, 400)), np.sin(np.linspace(0, 2 * np.pi, 400))], 1)
    empirical = 1.05 * theory[:300]
    full = curve_distance(empirical, theory)
    for cut in (-0.9, 0.0, 0.5):
        assert curve_distance(empirical, theory, exclude=lambda p, c=cut: p[:, 1] < c) <= full + 1e-12
