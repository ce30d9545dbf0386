"""Variable stars: ephemeris arithmetic, and Kwee and van Woerden against known minima.

The ephemeris T(E) = T0 + P E + Q E^2 is common practice of the trade; the checks put
times made from it back in.  The time of minimum is checked on light curves whose
minimum is known in closed form (a symmetric dip centred on a chosen time), sampled at
uneven times with Gaussian noise of known size: the minimum must be found within the
uncertainty the method states, and that uncertainty must match the scatter of the found
times over many noisy samples.  (The paper's own worked example is not reproduced: we do
not remember its observations.)
"""

import math

import numpy as np
import pytest

from calcfuncs import varstars
from calcfuncs.cells import evaluate

# Algol's ephemeris as the GCVS prints it (from memory): Min I = HJD 2445641.5135 +
# 2.8673075 E.  Used here as a realistic size of numbers, not as a check value.
T0, P = 2445641.5135, 2.8673075


@pytest.mark.parametrize("cycle", [-3000, -1, 0, 1, 2500, 7919])
def test_times_made_from_the_ephemeris_come_back(cycle):
    t = T0 + P * cycle
    assert evaluate("SKY.VARSTAR.CYCLE", [t, T0, P]) == cycle
    assert evaluate("SKY.VARSTAR.OC", [t, T0, P]) == pytest.approx(0.0, abs=1e-8)
    phase = evaluate("SKY.VARSTAR.PHASE", [t, T0, P])
    assert min(phase, 1.0 - phase) < 1e-8
    # A quarter period later: phase 0.25, the same cycle, O - C a quarter period.
    assert evaluate("SKY.VARSTAR.PHASE", [t + P / 4, T0, P]) == pytest.approx(0.25, abs=1e-8)
    assert evaluate("SKY.VARSTAR.OC", [t + P / 4, T0, P]) == pytest.approx(P / 4, abs=1e-8)
    # Just before the next minimum: the next cycle, early (negative O - C).
    assert evaluate("SKY.VARSTAR.CYCLE", [t + 0.9 * P, T0, P]) == cycle + 1
    assert evaluate("SKY.VARSTAR.OC", [t + 0.9 * P, T0, P]) == pytest.approx(-0.1 * P, abs=1e-8)


@pytest.mark.parametrize("q", [2.0e-10, -3.0e-10])
def test_a_quadratic_ephemeris(q):
    # Common practice: with a changing period the minima fall at T0 + P E + Q E^2.
    for cycle in (-4000, 15, 6000):
        t = T0 + P * cycle + q * cycle * cycle
        assert evaluate("SKY.VARSTAR.CYCLE", [t, T0, P, q]) == cycle
        assert evaluate("SKY.VARSTAR.OC", [t, T0, P, q]) == pytest.approx(0.0, abs=1e-8)
        # The same time against the linear ephemeris is off by Q E^2.
        assert evaluate("SKY.VARSTAR.OC", [t, T0, P]) == pytest.approx(q * cycle * cycle,
                                                                       abs=1e-8)


def test_bad_ephemeris_is_said():
    assert "period must be more than 0" in evaluate("SKY.VARSTAR.PHASE", [T0, T0, 0.0])
    assert "never reaches" in evaluate("SKY.VARSTAR.CYCLE", [T0 - 1e7, T0, 1.0, 1e-4])


def _dip(t, centre, depth=0.8, width=0.03):
    """A symmetric (Gaussian) dip in brightness: the magnitude is largest at ``centre``."""
    return 11.2 + depth * np.exp(-0.5 * ((t - centre) / width) ** 2)


def _observed(rng, centre, n=120, sigma=0.01, before=0.09, after=0.10, shape=_dip):
    t = np.sort(rng.uniform(centre - before, centre + after, n))
    return t, shape(t, centre) + rng.normal(0.0, sigma, n)


def _column(values):
    return tuple((float(v),) for v in values)


def test_kwee_van_woerden_finds_a_known_minimum_within_its_uncertainty():
    # One light curve through the cells: the analytic minimum at `centre`, 120 uneven
    # samples, noise 0.01 mag; found within three times the stated uncertainty.
    rng = np.random.default_rng(1956)
    centre = 2460512.43217
    t, m = _observed(rng, centre)
    found = evaluate("SKY.VARSTAR.MINIMUM", [_column(t), _column(m)])
    sigma = evaluate("SKY.VARSTAR.MINIMUM.ERROR", [_column(t), _column(m)])
    assert 0.0 < sigma < 0.001  # under 1.5 minutes for this curve
    assert abs(found - centre) < 3.0 * sigma


@pytest.mark.parametrize("shape", [
    _dip,
    # A V-shaped eclipse reaching the plateau near the ends of the rows, and a cosine: other
    # symmetric curves with the same known centre.
    lambda t, c: 11.5 - np.minimum(0.5, 6.0 * np.abs(t - c)),
    lambda t, c: 11.0 + 0.3 * np.cos(2.0 * math.pi * (t - c) / 0.4),
], ids=["gaussian", "v-shape", "cosine"])
def test_the_stated_uncertainty_matches_the_scatter(shape):
    # 300 noisy samplings of one curve: the found minima scatter about the true one as
    # the method says (the ratio of the scatter to the median stated uncertainty within
    # 0.6 to 1.6; between 50 and 85 % within one stated sigma, a normal law giving 68 %)
    # and without a bias larger than a third of the scatter.
    rng = np.random.default_rng(7)
    centre = 2460000.5
    errors, stated = [], []
    for _ in range(300):
        t, m = _observed(rng, centre, shape=shape)
        found, sigma = varstars.kwee_van_woerden(t, m)
        errors.append(found - centre)
        stated.append(sigma)
    errors, stated = np.array(errors), np.array(stated)
    ratio = errors.std() / np.median(stated)
    assert 0.6 < ratio < 1.6, ratio
    within = np.mean(np.abs(errors) < stated)
    assert 0.50 < within < 0.85, within
    assert abs(errors.mean()) < errors.std() / 3.0


def test_the_order_of_the_rows_does_not_matter():
    rng = np.random.default_rng(11)
    t, m = _observed(rng, 2459876.25)
    shuffle = rng.permutation(t.size)
    assert varstars.kwee_van_woerden(t, m) == varstars.kwee_van_woerden(t[shuffle], m[shuffle])


def test_empty_rows_are_skipped():
    rng = np.random.default_rng(12)
    t, m = _observed(rng, 2459876.25)
    plain = evaluate("SKY.VARSTAR.MINIMUM", [_column(t), _column(m)])
    padded_t = _column(t[:60]) + ((None,), (None,)) + _column(t[60:])
    padded_m = _column(m[:60]) + ((None,), (None,)) + _column(m[60:])
    assert evaluate("SKY.VARSTAR.MINIMUM", [padded_t, padded_m]) == plain


@pytest.mark.parametrize("times,mags,mention", [
    (_column(range(20)), _column(range(19)), "different numbers of cells"),
    (_column(range(5)), _column(range(5)), "at least 8"),
    (_column(range(10)) + (("noon",),), _column(range(11)), 'row 11 of times is not a number'),
    (_column(range(10)) + ((None,),), _column(range(11)), "empty in times"),
    (_column([1, 1, 2, 3, 4, 5, 6, 7, 8]), _column(range(9)), "same time"),
    # A monotonic fade has no minimum to find.
    (_column(np.linspace(0, 1, 40)), _column(np.linspace(10, 12, 40)), "minimum"),
    ("#SKY: some problem", _column(range(1)), "some problem"),
])
def test_bad_ranges_are_said(times, mags, mention):
    got = evaluate("SKY.VARSTAR.MINIMUM", [times, mags])
    assert isinstance(got, str) and got.startswith("#SKY: ") and mention in got, got


def test_the_api_takes_lists():
    from calcfuncs import api

    rng = np.random.default_rng(13)
    t, m = _observed(rng, 2459000.0)
    assert api.varstar_minimum(list(t), list(m)) == varstars.kwee_van_woerden(t, m)[0]
    with pytest.raises(ValueError, match="at least 8"):
        api.varstar_minimum([1.0, 2.0], [3.0, 4.0])


def test_the_command_line_refuses_a_reduction_of_whole_columns(tmp_path):
    # One value from a whole column is not one value per row: the CSV tool says so.
    import io

    from calcfuncs import cli

    log = tmp_path / "curve.csv"
    log.write_text("t,v\n1,10\n2,11\n")
    err = io.StringIO()
    status = cli.main(["SKY.VARSTAR.MINIMUM", "--in", str(log), "--arg", "times=t",
                       "--arg", "magnitudes=v", "--out", str(tmp_path / "out.csv")],
                      out=io.StringIO(), err=err)
    assert status == 2 and "reduces whole ranges" in err.getvalue()
    assert not (tmp_path / "out.csv").exists()
