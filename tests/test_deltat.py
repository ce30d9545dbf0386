"""Delta T, UT before 1960, local mean time, and UTC in its early years.

References, named on each table:
  - Morrison, Stephenson, Hohenkerk and Zawilski (2021), Table S15 (v. 2020), as bundled
    in skyfield 1.55 (``delta_t.npz``, "Table-S15.2020.txt"), and skyfield 1.55's own
    built-in Delta T, which uses those splines between -720 and the start of its daily
    table (1973);
  - Espenak and Meeus, Five Millennium Canon of Solar Eclipses (2006), Table 1 and their
    polynomial page (NASA eclipse web site), values from memory; PyMeeus 0.5.12's copy of
    the same polynomials (skipped when PyMeeus is not installed);
  - Morrison and Stephenson (2004) and Stephenson and Houlden (1986), the uncertainty
    tables of the NASA eclipse web site, values from memory;
  - the USNO table of TAI - UTC (tai-utc.dat, the source of ERFA dat.c), its 1960s rows
    from memory; ERFA's t_erfa_c.c test values for eraDat; astropy 8.0 for the same
    instants.
"""

import datetime
import math
import warnings

import erfa
import numpy as np
import pytest
from astropy.time import Time
from astropy.utils import iers
from skyfield.api import load
from skyfield.curvelib import Splines
from skyfield.functions import load_bundled_npy
from skyfield.timelib import (
    delta_t_parabola_morrison_stephenson_2004,
    delta_t_parabola_stephenson_morrison_hohenkerk_2016,
)

from calcfuncs import deltat
from calcfuncs.cells import evaluate
from calcfuncs.timeinput import instants
from calcfuncs.timescales import seconds_between

iers.conf.auto_download = False

JULIAN_YEAR_DAYS = 365.25
J2000 = 2451545.0


def year_jd(year):
    """JD of a decimal (Julian-epoch) year: 2000.0 is J2000.0 (common practice)."""
    return J2000 + (year - 2000.0) * JULIAN_YEAR_DAYS


def jd_text(jd):
    return f"JD {float(jd)!r}"


def column(values):
    return tuple((v,) for v in values)


def flat(result):
    return [row[0] for row in result]


def numbers(result):
    values = flat(result)
    bad = [v for v in values if not isinstance(v, float)]
    assert not bad, bad[:3]
    return np.array(values)


# ---- SMH2016: the spline of Morrison et al. 2021, Table S15 -------------------------------

# skyfield's copy of the published table, rows (K_i, K_i+1, a3, a2, a1, a0).
S15 = load_bundled_npy("delta_t.npz")["Table-S15.2020.txt"]
KNOTS = list(S15[0]) + [S15[1][-1]]


def test_smh2016_table_is_the_published_table_s15():
    # Every knot and coefficient equals skyfield 1.55's bundled copy of Table S15 (v. 2020).
    ours = deltat.SMH_TABLE
    theirs = np.column_stack([S15[0], S15[1], S15[5], S15[4], S15[3], S15[2]])
    assert ours.shape == theirs.shape
    assert np.array_equal(ours, theirs)


@pytest.mark.parametrize("k", range(S15.shape[1]))
def test_smh2016_at_each_knot_is_its_a0(k):
    # At the knot K_i the spline is a0 (t = 0): Table S15 (v. 2020) via skyfield 1.55.
    # 1e-9 s: a0 comes straight out of the polynomial at t = 0.
    knot, a0 = S15[0][k], S15[5][k]
    assert abs(float(deltat.smh2016(knot)) - a0) < 1e-9


@pytest.mark.parametrize("knot", KNOTS[1:-1])
def test_smh2016_is_continuous_at_its_knots(knot):
    # Continuous by construction.  The coefficients are published to 0.001 s, so the end
    # of one segment (a0 + a1 + a2 + a3) and the start of the next (a0) may differ by the
    # rounding of up to four numbers: 4 x 0.0005 = 0.002 s.  (Observed: at most 0.0010 s.)
    eps = 1e-7  # years (3 s); the slope is below 20 s/yr, so under 2e-6 s of change
    below, above = float(deltat.smh2016(knot - eps)), float(deltat.smh2016(knot + eps))
    assert abs(above - below) <= 0.002


def test_smh2016_matches_skyfield_splines_at_the_same_year():
    # The same published spline in skyfield 1.55 (curvelib.Splines over Table S15):
    # equal to rounding at every hundredth of a year from -720 to 2019.
    years = np.arange(-720.0, 2019.0, 0.01)
    assert np.max(np.abs(deltat.smh2016(years) - Splines(S15)(years))) < 1e-9


@pytest.fixture(scope="module")
def skyfield_ts():
    return load.timescale(builtin=True)


# Instants between -720 and 1950 at which skyfield's built-in Delta T is the Table S15
# spline (its daily table starts in 1973).  Every 0.37 year: all segments, many phases.
# From just after -720, where both use the spline (before it each joins its own way).
SKYFIELD_YEARS = np.arange(-719.99, 1950.0, 0.37)


def test_skyfield_builtin_delta_t_is_the_s15_spline_before_1950(skyfield_ts):
    # The premise of the comparison below: skyfield's built-in Delta T evaluated at its
    # TT year is Table S15 at that year (equal to rounding).
    jd = year_jd(SKYFIELD_YEARS)
    assert np.max(np.abs(skyfield_ts.tt_jd(jd).delta_t - Splines(S15)(SKYFIELD_YEARS))) < 1e-9


def test_cell_delta_t_smh2016_matches_skyfield_builtin(skyfield_ts):
    # skyfield 1.55 load.timescale(builtin=True).  skyfield evaluates the spline at the
    # TT year, we at the UT year (the spline is tabulated against UT): at one TT instant
    # the two differ by (slope x Delta T): 16 s/yr x 20,400 s / 31,557,600 s/yr = 0.0104 s
    # at -720, less later.  Evaluating skyfield's spline at the UT year instead
    # (TT - Delta T) leaves only second-order differences: 1e-5 s.
    jd = year_jd(SKYFIELD_YEARS)
    ours = numbers(evaluate("SKY.DELTAT", [column(map(jd_text, jd)), "TT", None, "SMH2016"]))
    theirs = skyfield_ts.tt_jd(jd).delta_t
    assert np.max(np.abs(ours - theirs)) < 0.011
    at_ut = skyfield_ts.tt_jd(jd - theirs / 86400.0).delta_t
    assert np.max(np.abs(ours - at_ut)) < 1e-5


def test_ut_through_delta_t_matches_skyfield_ut1(skyfield_ts):
    # A UT instant before 1960 goes to TT through Delta T: TT - UT from the cell's UT
    # scale against skyfield's ts.ut1_jd(jd).tt - jd; the same TT/UT-year difference as
    # above bounds the agreement (0.011 s), and skyfield's one-double TT adds 20 us.
    jd = year_jd(SKYFIELD_YEARS)
    tt = numbers(evaluate("SKY.JD", [column(map(jd_text, jd)), "UT", "TT"]))
    theirs = (skyfield_ts.ut1_jd(jd).tt - jd) * 86400.0
    ours = (tt - jd) * 86400.0
    # The cell returns TT as one double: 2.3e-10 day = 20 us at these JDs.
    assert np.max(np.abs(ours - theirs)) < 0.011 + 4e-5


def test_smh2016_before_720_bc_is_the_long_term_parabola_shifted():
    # Before -720: the long-term parabola -320 + 32.5 u^2, u = (year - 1825)/100
    # (Stephenson, Morrison and Hohenkerk 2016; skyfield 1.55's copy), shifted by one
    # constant so that it meets the spline at -720.  The shift is our own choice; its
    # size is the gap between the published parabola and the published spline at -720.
    gap = float(Splines(S15)(-720.0) - delta_t_parabola_stephenson_morrison_hohenkerk_2016(-720.0))
    assert abs(gap - (-358.48)) < 0.01  # the "358 s" of the module and wizard texts
    years = np.linspace(-20000.0, -720.0, 2001)
    expected = delta_t_parabola_stephenson_morrison_hohenkerk_2016(years) + gap
    assert np.max(np.abs(deltat.smh2016(years) - expected)) < 1e-6 * np.max(expected)
    # The join is continuous (by construction, to rounding).
    assert abs(float(deltat.smh2016(-720.0 - 1e-7)) - float(deltat.smh2016(-720.0))) < 1e-3


def test_smh2016_after_2019_says_so():
    got = evaluate("SKY.DELTAT", ["2020-01-01", "UT", None, "SMH2016"])
    assert got.startswith("#SKY: ") and "2019" in got and "ESPENAK2006" in got


# ---- ESPENAK2006: Espenak and Meeus (2006) ---------------------------------------------

# Table 1 of the Five Millennium Canon (the NASA eclipse web site's Delta T table),
# values from memory.  Tolerances: the polynomial page says the -500..+500 polynomial
# reproduces Table 1 within 4 s (with 17190 at -500 changed to 17203.7 to meet the
# parabola); for +500..+1600 it states no bound, and Table 1 is given to 10 s there, so
# 5 s (half its step) is allowed; from 1700 the table is given to 1 s (0.5 s allowed)
# and from 1955 to 0.1 s (0.15 s allowed: half the step plus the fit).
ESPENAK_TABLE_1 = [
    (-500, 17203.7, 4.0), (-400, 15530, 4.0), (-300, 14080, 4.0), (-200, 12790, 4.0),
    (-100, 11640, 4.0), (0, 10580, 4.0), (100, 9600, 4.0), (200, 8640, 4.0),
    (300, 7680, 4.0), (400, 6700, 4.0), (500, 5710, 5.0), (600, 4740, 5.0),
    (700, 3810, 5.0), (800, 2960, 5.0), (900, 2200, 5.0), (1000, 1570, 5.0),
    (1100, 1090, 5.0), (1200, 740, 5.0), (1300, 490, 5.0), (1400, 320, 5.0),
    (1500, 200, 5.0), (1600, 120, 0.5), (1700, 9, 0.5), (1750, 13, 0.5), (1800, 14, 0.5),
    (1850, 7, 0.5), (1900, -3, 0.5), (1950, 29, 0.5), (1955, 31.1, 0.15),
    (1960, 33.2, 0.15), (1965, 35.7, 0.15), (1970, 40.2, 0.15), (1975, 45.5, 0.15),
    (1980, 50.5, 0.15), (1985, 54.3, 0.15), (1990, 56.9, 0.15), (1995, 60.8, 0.15),
    (2000, 63.8, 0.15), (2005, 64.7, 0.15),
]


@pytest.mark.parametrize("year, table, tolerance", ESPENAK_TABLE_1)
def test_espenak2006_reproduces_table_1(year, table, tolerance):
    # The model at the tabulated year, and the cell at that year's instant on UT
    # (decimal year = 2000 + (JD - 2451545)/365.25, common practice).  The cell takes
    # Delta T at the UT date its own model gives, which near a segment boundary may fall
    # on the other side of it: the same tolerance serves.
    assert abs(float(deltat.espenak2006(year)) - table) <= tolerance
    cell = evaluate("SKY.DELTAT", [jd_text(year_jd(year)), "UT", None, "ESPENAK2006"])
    assert abs(cell - table) <= tolerance


def test_espenak2006_matches_pymeeus_polynomials():
    # PyMeeus 0.5.12, Epoch.tt2ut(year, month): the same polynomials of Espenak and Meeus,
    # taken independently from the NASA page.  PyMeeus picks the segment by ``year`` and
    # uses y = year + (month - 0.5)/12: month 0.5 makes y the decimal year itself.
    # (Installed on demand: pip install pymeeus.)
    epoch = pytest.importorskip("pymeeus.Epoch").Epoch
    years = np.concatenate([np.arange(-3000.0, 3000.0, 0.73), [-500.0, 500.0, 1600.0, 2150.0]])
    ours = deltat.espenak2006(years)
    theirs = np.array([epoch.tt2ut(float(y), 0.5) for y in years])
    # Same formulas, different evaluation order: 1e-12 relative.
    assert np.max(np.abs(ours - theirs) / np.maximum(np.abs(theirs), 1.0)) < 1e-12


def test_espenak2006_at_500_bc_is_the_changed_value():
    # The polynomial page: 17190 of Table 1 at -500 was changed to 17203.7 so that the
    # -500..+500 polynomial meets the long-term parabola -20 + 32 u^2 there.
    assert abs(float(deltat.espenak2006(-500.0)) - 17203.7) < 0.1
    assert abs(float(deltat.espenak2006(-500.0)) - 17190.0) > 10.0


ESPENAK_BOUNDARIES = [
    # (year, tolerance s, note).  The polynomial page gives independent fits per span and
    # states no continuity; they meet within a fraction of a second, the 1 s rounding of
    # Table 1 up to 1900 (0.5 s allowed) and its 0.1 s rounding after (0.1 s allowed).
    # Observed jumps: 1600 0.25 s, 1700 0.16 s, 1900 0.09 s, 500 0.09 s, 2005 0.05 s.
    (-500.0, 0.1, "meets the parabola by the changed value 17203.7"),
    (500.0, 0.5, ""), (1600.0, 0.5, ""), (1700.0, 0.5, ""), (1800.0, 0.5, ""),
    (1860.0, 0.5, ""), (1900.0, 0.5, ""), (1920.0, 0.1, ""), (1941.0, 0.1, ""),
    (1961.0, 0.1, ""), (1986.0, 0.1, ""), (2005.0, 0.1, ""),
    (2050.0, 0.01, "2050-2150 expression is built to meet the 2005-2050 one"),
    (2150.0, 0.01, "the -0.5628 (2150 - y) term makes it meet the parabola"),
]


@pytest.mark.parametrize("year, tolerance, note", ESPENAK_BOUNDARIES)
def test_espenak2006_segments_meet(year, tolerance, note):
    eps = 1e-7  # years; under 2e-6 s of change at any slope here
    jump = float(deltat.espenak2006(year)) - float(deltat.espenak2006(year - eps))
    assert abs(jump) <= tolerance, note


def test_espenak2006_outside_its_polynomials_is_the_2004_parabola():
    # Before -500 and after 2150: -20 + 32 u^2, u = (year - 1820)/100 (Morrison and
    # Stephenson 2004; skyfield 1.55's copy of the same parabola).
    years = np.concatenate([np.linspace(-20000.0, -500.001, 500), np.linspace(2150.0, 20000.0, 500)])
    expected = delta_t_parabola_morrison_stephenson_2004(years)
    assert np.max(np.abs(deltat.espenak2006(years) - expected) / np.abs(expected)) < 1e-12


def test_models_are_chosen_by_name_and_auto_is_smh2016_before_1960():
    text = "44 BC March 15 10:00"
    smh = evaluate("SKY.DELTAT", [text, "UT", None, "SMH2016"])
    esp = evaluate("SKY.DELTAT", [text, "UT", None, "ESPENAK2006"])
    assert abs(evaluate("SKY.DELTAT", [text, "UT"]) - smh) < 1e-6  # AUTO
    # Each is its model at the UT year of the instant.  1e-3 s: a model's value is taken
    # at the UT date that model gives for the instant's TT, here 2 min off the default
    # one's (a change of 4e-5 s at 10 s/yr).
    year = 2000.0 + (1705425.5 + 10 / 24 - J2000) / JULIAN_YEAR_DAYS
    assert abs(smh - float(deltat.smh2016(year))) < 1e-3
    assert abs(esp - float(deltat.espenak2006(year))) < 1e-3
    bad = evaluate("SKY.DELTAT", [text, "UT", None, "SMH2015"])
    assert bad.startswith("#SKY: ") and "SMH2016" in bad and "ESPENAK2006" in bad


def test_measured_delta_t_is_refused_before_1960():
    got = evaluate("SKY.DELTAT", ["1950-01-01", "UT", None, "MEASURED"])
    assert got.startswith("#SKY: ") and "1960" in got


# ---- uncertainty ---------------------------------------------------------------------

UNCERTAINTY = [
    # decimal year (at its instant on UT), sigma in s, source (NASA eclipse web site,
    # "Uncertainty in Delta T", Tables 1 and 2, from memory), tolerance (the rounding).
    (-999.0, 636, "M&S 2004; NASA Table 1 row -1000, the text's 1000 BCE = -999", 0.5),
    (-500.0, 431, "M&S 2004, 0.8 u^2; NASA Table 1", 0.5),
    (0.0, 265, "M&S 2004, 0.8 u^2; NASA Table 1", 0.5),
    (500.0, 139, "M&S 2004, 0.8 u^2; NASA Table 1", 0.5),
    (1000.0, 54, "M&S 2004, 0.8 u^2; NASA Table 1", 0.5),
    (1200.0, 31, "M&S 2004, 0.8 u^2; NASA Table 1", 0.5),
    (1700.0, 5, "Stephenson and Houlden 1986; NASA Table 2", 0.0),
    (1800.0, 1, "Stephenson and Houlden 1986; NASA Table 2", 0.0),
    (1900.0, 0.1, "Stephenson and Houlden 1986; NASA Table 2", 0.0),
]


@pytest.mark.parametrize("year, sigma, source, tolerance", UNCERTAINTY)
def test_delta_t_uncertainty_published_values(year, sigma, source, tolerance):
    got = evaluate("SKY.DELTAT.UNCERTAINTY", [jd_text(year_jd(year)), "UT"])
    assert isinstance(got, float) and abs(got - sigma) <= tolerance + 1e-9, (got, source)


def test_uncertainty_follows_0_8_u_squared_between_the_rows():
    # Morrison and Stephenson 2004: sigma = 0.8 u^2 s, u = (year - 1820)/100, for 1000
    # BC to AD 1200; at dates on UT, decimal year = 2000 + (JD - 2451545)/365.25.
    jd = np.linspace(year_jd(-998.0), year_jd(1199.0), 301)
    got = numbers(evaluate("SKY.DELTAT.UNCERTAINTY", [column(map(jd_text, jd)), "UT"]))
    u = ((2000.0 + (jd - J2000) / JULIAN_YEAR_DAYS) - 1820.0) / 100.0
    assert np.max(np.abs(got - 0.8 * u * u)) < 1e-6


@pytest.mark.parametrize("date", ["1300-01-01", "1500-06-01", "1650-01-01", "2000-01-01",
                                  "-2000-01-01", "1201-06-01", "1002 BC June 1"])
def test_uncertainty_outside_the_published_ranges_says_so(date):
    # No published figure here (1300-1600: "about 20 s" is a remark, not a table value).
    got = evaluate("SKY.DELTAT.UNCERTAINTY", [date, "UT"])
    assert isinstance(got, str) and got.startswith("#SKY: ") and "no published" in got, got


# ---- UTC in the 1960s and TAI - UTC ----------------------------------------------------

# TAI - UTC = offset + (MJD - MJD0) x rate from each date on (USNO tai-utc.dat, the
# table in ERFA dat.c; from memory).  From 1972 whole seconds.
UTC_ROWS = [
    ((1960, 1, 1), 1.4178180, 37300, 0.0012960),
    ((1961, 1, 1), 1.4228180, 37300, 0.0012960),
    ((1961, 8, 1), 1.3728180, 37300, 0.0012960),
    ((1962, 1, 1), 1.8458580, 37665, 0.0011232),
    ((1963, 11, 1), 1.9458580, 37665, 0.0011232),
    ((1964, 1, 1), 3.2401300, 38761, 0.0012960),
    ((1964, 4, 1), 3.3401300, 38761, 0.0012960),
    ((1964, 9, 1), 3.4401300, 38761, 0.0012960),
    ((1965, 1, 1), 3.5401300, 38761, 0.0012960),
    ((1965, 3, 1), 3.6401300, 38761, 0.0012960),
    ((1965, 7, 1), 3.7401300, 38761, 0.0012960),
    ((1965, 9, 1), 3.8401300, 38761, 0.0012960),
    ((1966, 1, 1), 4.3131700, 39126, 0.0025920),
    ((1968, 2, 1), 4.2131700, 39126, 0.0025920),
    ((1972, 1, 1), 10.0, 0, 0.0),
]


def _mjd(date):
    return (datetime.date(*date) - datetime.date(1858, 11, 17)).days  # MJD 0 (common practice)


def _tai_minus_utc(row, mjd):
    _, offset, mjd0, rate = row
    return offset + (mjd - mjd0) * rate


def _utc_cases():
    """The first day of each row and the day before it, at several clock times."""
    for k, row in enumerate(UTC_ROWS):
        start = _mjd(row[0])
        for clock, fraction in (("00:00:00", 0.0), ("12:00:00", 0.5)):
            day = datetime.date(*row[0]).isoformat()
            yield pytest.param(f"{day}T{clock}", _tai_minus_utc(row, start + fraction),
                               id=f"{day}T{clock}")
        if k == 0:
            continue
        before = datetime.date(*row[0]) - datetime.timedelta(days=1)
        # The size of the step at the end of the day before (0 where only the rate
        # changes: 1962, 1964, 1966).
        step = _tai_minus_utc(row, start) - _tai_minus_utc(UTC_ROWS[k - 1], start)
        for clock, fraction in (("00:00:00", 0.0), ("12:00:00", 0.5), ("23:59:59", 86399 / 86400)):
            yield pytest.param(f"{before.isoformat()}T{clock}",
                               _tai_minus_utc(UTC_ROWS[k - 1], start - 1 + fraction),
                               id=f"{before.isoformat()}T{clock}")


def _astropy_tai_minus_utc(iso):
    # astropy 8.0: the TAI instant of the UTC clock reading, minus the same clock
    # reading taken as TAI.
    return (Time(iso, scale="utc").tai - Time(iso, scale="tai")).sec


@pytest.mark.parametrize("iso, tai_minus_utc", list(_utc_cases()))
def test_tai_minus_utc_around_each_step_of_the_1960s(iso, tai_minus_utc):
    # 1 us: a date-time cell's resolution (the table values have 7 decimals).
    assert abs(_astropy_tai_minus_utc(iso) - tai_minus_utc) < 1e-6  # the reference agrees
    got = evaluate("SKY.LEAPSECONDS", [iso])
    assert isinstance(got, float) and abs(got - tai_minus_utc) < 1e-6, got


def test_utc_instants_on_1960s_step_days_match_astropy():
    # The instants themselves are right on those days (astropy 8.0): UTC to TAI as MJD.
    isos = [p.values[0] for p in _utc_cases()]
    ours = numbers(evaluate("SKY.MJD", [column(isos), "UTC", "TAI"]))
    tai = Time(isos, scale="utc").tai
    theirs = (tai.jd1 - 2400000.5) + tai.jd2
    assert np.max(np.abs(ours - theirs)) * 86400.0 < 1e-6  # MJD double: 1e-11 day = 1 us


ERFA_DAT = [
    # ERFA t_erfa_c.c, t_dat (from memory), and the 1960 row at its first instant.
    ("2003-06-01", 32.0, "t_erfa_c.c: eraDat(2003, 6, 1, 0.0) = 32.0"),
    ("2008-01-17", 33.0, "t_erfa_c.c: eraDat(2008, 1, 17, 0.0) = 33.0"),
    ("2017-09-01", 37.0, "t_erfa_c.c: eraDat(2017, 9, 1, 0.0) = 37.0"),
    ("1960-01-01", 1.4178180 + (36934 - 37300) * 0.001296, "1960 row of tai-utc.dat at MJD 36934"),
]


@pytest.mark.parametrize("iso, value, source", ERFA_DAT)
def test_tai_minus_utc_erfa_test_values(iso, value, source):
    assert abs(evaluate("SKY.LEAPSECONDS", [iso]) - value) < 1e-9, source


@pytest.mark.parametrize("iso, value", [
    # IERS Bulletin C: TAI - UTC was 36 s from 2015-07-01 to the leap second at the end
    # of 2016-12-31, and 10 s through 1972-06-30 (common practice).
    ("2016-12-31T12:00:00", 36.0),
    ("2016-12-31T23:59:59", 36.0),
    ("1972-06-30T12:00:00", 10.0),
])
def test_tai_minus_utc_on_a_leap_second_day(iso, value):
    assert abs(evaluate("SKY.LEAPSECONDS", [iso]) - value) < 1e-6


@pytest.mark.parametrize("iso, value", [("2017-01-01T00:00:00", 37.0), ("2016-12-31T00:00:00", 36.0),
                                        ("1972-07-01T00:00:00", 11.0)])
def test_tai_minus_utc_at_the_start_of_days_around_leap_seconds(iso, value):
    # IERS Bulletin C (common practice).
    assert abs(evaluate("SKY.LEAPSECONDS", [iso]) - value) < 1e-6


BEFORE_1960 = [
    ("SKY.JD", ["1959-12-31T23:59:59", "UTC", "TT"]),
    ("SKY.JD", ["44 BC March 15 10:00", "UTC", "TT"]),
    ("SKY.JD", ["1066-10-14", "UT1"]),
    ("SKY.JD", ["1959-06-01", "UT", "UTC"]),
    ("SKY.LEAPSECONDS", ["1955-01-01"]),
    ("SKY.DELTAT", [-30000.0]),  # a date-time value of 1817 on the default scale UTC
    ("SKY.TEXT.DATE", ["-0043-03-15T10:00"]),
]


@pytest.mark.parametrize("name, args", BEFORE_1960)
def test_utc_before_1960_is_refused_and_names_ut(name, args):
    # UTC (and UT1 from it) starts in 1960 (ERFA's table; common practice).
    got = evaluate(name, args)
    assert isinstance(got, str) and got.startswith("#SKY: "), got
    assert "1960" in got and "scale UT " in got, got


def test_utc_starts_on_1960_january_1():
    assert isinstance(evaluate("SKY.JD", ["1960-01-01T00:00:00", "UTC", "TT"]), float)


# ---- UT at any date, local mean time, a Delta T of one's own -------------------------------

def _two_part(text, scale):
    return instants(np.array([text], dtype=object), scale)


@pytest.mark.parametrize("text", ["44 BC March 15 10:00", "-1000-07-12T12:00", "1066-10-14 09:00",
                                  "1850-06-01", "1959-12-31T23:00"])
def test_ut_before_1960_reaches_tt_through_the_default_model(text):
    # TT - UT = Delta T of SMH2016 at the UT date (the model of record), to 1 us.
    ut = _two_part(text, "UT")
    tt = ut.to("TT")
    year = 2000.0 + ((ut.jd1[0] - J2000) + ut.jd2[0]) / JULIAN_YEAR_DAYS
    assert abs(seconds_between(tt, ut)[0] - float(deltat.smh2016(year))) < 1e-6


def test_ut_from_1960_is_measured():
    # From 1960 UT is UT1 = UTC + DUT1: TT - UT1 = 32.184 s + (TAI - UTC) - DUT1; in
    # 1990 TAI - UTC was 25 s (IERS Bulletin C, common practice), DUT1 taken as 0.
    assert abs(evaluate("SKY.DELTAT", ["1990-06-01", "UT"]) - 57.184) < 1e-6
    assert abs(evaluate("SKY.DELTAT", ["1990-06-01", "UT", 0.3]) - 56.884) < 1e-6


LMT_CASES = [
    # local mean time, east longitude (deg), the same instant on UT: LMT = UT + lon/15 h
    # (common practice).  Rome (12.4964 E) and a western site (77.0365 W).
    ("44 BC March 15 10:00", 12.4964),
    ("-0043-03-15T10:00", 12.4964),
    ("1066-10-14 09:00", 0.5739),
    ("1492-10-12 02:00", -74.5),
    ("1850-06-01 12:00", -77.0365),
    ("2024-03-20 03:06", 139.69),
]


@pytest.mark.parametrize("text, lon", LMT_CASES)
def test_local_mean_time_is_ut_plus_longitude_over_15(text, lon):
    lmt = _two_part(text, f"LMT {lon}")
    ut = lmt.to("UT")
    # 1 us in the two-part JD.
    assert abs(seconds_between(lmt, ut)[0] - lon / 15.0 * 3600.0) < 1e-6
    # And on to TT it is the UT instant's TT.
    plain = _two_part(text, "UT")
    shifted = type(plain)(plain.jd1, plain.jd2 - lon / 360.0, "UT")
    assert abs(seconds_between(lmt.to("TT"), shifted.to("TT"))[0]) < 1e-6


def test_local_mean_time_as_text():
    # 12.4964 deg / 15 = 0.833093 h = 49 min 59.136 s (common practice arithmetic).
    got = evaluate("SKY.TEXT.DATE", ["44 BC March 15 10:00", "UT", "LMT 12.4964", None, None, 3])
    assert got == "44 BC March 15 10:49:59.136"
    back = evaluate("SKY.TEXT.DATE", ["44 BC March 15 10:49:59.136", "LMT 12.4964", "UT", None, None, 3])
    assert back == "44 BC March 15 10:00:00.000"


@pytest.mark.parametrize("text", ["44 BC March 15 10:00", "-2500-01-01", "1700-06-01T12:00", "2500-01-01"])
def test_a_delta_t_of_ones_own_overrides_the_model(text):
    # "UT 10850": TT - UT is exactly the value given, here 10850 s = 3 h 0 min 50 s.
    ut = _two_part(text, "UT 10850")
    assert abs(seconds_between(ut.to("TT"), ut)[0] - 10850.0) < 1e-6
    tt = ut.to("TT")
    assert abs(seconds_between(tt, tt.to("UT 10850"))[0] - 10850.0) < 1e-6


def test_a_delta_t_of_ones_own_as_text():
    got = evaluate("SKY.TEXT.DATE", ["44 BC March 15 10:00", "UT 10850", "TT", None, None, 3])
    assert got == "44 BC March 15 13:00:50.000"
    got = evaluate("SKY.TEXT.DATE", ["44 BC March 15 10:00", "LMT 12.4964 10850", "TT", None, None, 3])
    assert got == "44 BC March 15 12:10:50.864"  # 10:00 - 49:59.136 + 3:00:50


def test_a_named_model_on_the_scale():
    ut = _two_part("44 BC March 15 10:00", "UT ESPENAK2006")
    year = 2000.0 + ((ut.jd1[0] - J2000) + ut.jd2[0]) / JULIAN_YEAR_DAYS
    assert abs(seconds_between(ut.to("TT"), ut)[0] - float(deltat.espenak2006(year))) < 1e-6


# ---- validity of the leap-second table ---------------------------------------------------

# ERFA dat.c: IYV, the release year; dates after IYV + 5 are "dubious" (from memory):
# ERFA 2.0.0 is of 2021 and 2.0.1 of 2023.
ERFA_RELEASE_YEAR = {"2.0.0": 2021, "2.0.1": 2023}


def test_leap_second_table_valid_until_release_year_plus_five():
    version = erfa.version.erfa_version
    if version not in ERFA_RELEASE_YEAR:
        pytest.skip(f"release year of ERFA {version} not in the table")
    last = datetime.date(ERFA_RELEASE_YEAR[version] + 5, 12, 31)  # 2028-12-31 for 2.0.1
    for null_date in [(1899, 12, 30), (1900, 1, 1), (1904, 1, 1)]:
        want = float((last - datetime.date(*null_date)).days)  # Calc date-time value
        assert evaluate("SKY.LEAPSECONDS.UNTIL", [], null_date) == want
    # ERFA itself: quiet on that day, "dubious year" on the next.
    with warnings.catch_warnings():
        warnings.simplefilter("error", erfa.ErfaWarning)
        erfa.dat(last.year, 12, 31, 0.0)
        with pytest.raises(erfa.ErfaWarning):
            erfa.dat(last.year + 1, 1, 1, 0.0)
