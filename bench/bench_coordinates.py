"""How fast Eclipsheet converts coordinates and finds altitudes, and where the time goes.

A benchmark, not a test: it prints numbers and asserts nothing about speed.

    .venv/bin/python bench/bench_coordinates.py [--oxt dist/eclipsheet.oxt] [--rows 10000]
                        [--core-rows 100000] [--repeats 3] [--no-office] [--profile]
                        [--json out.json]

Core part (no office, this Python), ``--core-rows`` rows:

  SKY.COORD.LON / LAT from EQUATORIAL J2000 to ECLIPTIC DATE, through
  ``calcfuncs.cells.evaluate`` with whole columns, against the same conversion written
  with pyerfa alone: UTC quasi-JD -> TAI -> TT (utctai, taitt), the J2000 frame bias
  from bp06, the ecliptic of date from ecm06, s2c / c2s.  Once with a distinct date on
  every row, once with one date shared by all rows (a single time value, as a column
  formula with ``$A$1`` passes it; the raw code then builds the matrix once).
  SKY.COORD.LON to GALACTIC (no date; raw: trxp with the bias, icrs2g).
  SKY.HORIZON.ALT against erfa.atco13, distinct times; and with one shared time, where
  raw pyerfa does apco13 once and atciq + atioq per row.
  Each row also times the core function alone (``calcfuncs.frames`` / ``horizon`` on
  arrays already read), so that evaluate = cell layer + core function.
  Then the single-cell path of ``evaluate`` (one call per cell, as a per-cell formula
  makes) on the office part's inputs, cache emptied first.  ``--profile`` adds the
  top functions by own time (cProfile) of one evaluate per case and of the
  single-cell path.

Office part (a real headless LibreOffice with the .oxt installed), ``--rows`` rows, the
approach of ``bench_recalc.py``: one fresh document per case with automatic
calculation off, formulas filled down from row 2 (``fillAuto``), the first
``calculateAll()`` cold and the best of ``--repeats`` more warm, every timed cell read
back and checked against the core computed here.

  per-cell   SKY.COORD.LON and SKY.COORD.LAT to ECLIPTIC DATE, SKY.COORD.LON to
             GALACTIC, SKY.HORIZON.ALT: one formula per cell
  column     the same four as one array formula per column
  floor      =SKY.VERSION() in every cell (the cost of crossing the bridge)
  native     Calc's own formulas of low precision: ecliptic from a fixed obliquity of
             23.4393 deg plus a linear precession in longitude of 1.3969713 deg per
             Julian century; galactic from the J2000 north galactic pole; altitude from
             a linear GMST and the spherical triangle, J2000 RA/Dec taken as of date

Inputs are invented: random directions over the whole sky (seeded) and the observing
log of ``bench_recalc.py`` (UTC date-times 2024-2026), at the invented hill station
of an invented club (47.3814 N, 8.0542 E, 455 m).  Other office processes on the
machine disturb the timings; run it on a quiet machine for numbers to quote.
"""

import argparse
import cProfile
import os
import platform
import pstats
import sys
import time
import warnings

BENCH = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(BENCH)
sys.path.insert(0, ROOT)
sys.path.insert(0, os.path.join(ROOT, "tools"))
sys.path.insert(0, BENCH)

import bench_recalc  # noqa: E402
import erfa  # noqa: E402
import numpy as np  # noqa: E402
from bench_recalc import _office_version, _us, log_times  # noqa: E402
from timing import best, save_figures  # noqa: E402

from calcfuncs import frames, horizon  # noqa: E402
from calcfuncs.cells import evaluate  # noqa: E402
from calcfuncs.timeinput import read_times  # noqa: E402
from calcfuncs.timescales import Instants  # noqa: E402

SITE_LAT = 47.3814  # invented hill station, degrees north
SITE_LON = 8.0542  # degrees east
SITE_HEIGHT = 455.0  # metres above the ellipsoid
FROM = "EQUATORIAL J2000"
TARGET_RATIO = 1.2  # the goal for the coordinate columns, core over raw pyerfa
J2000_JD = bench_recalc.J2000_JD


def sky_positions(n, seed=2026):
    """``n`` random directions, uniform over the sphere: (RA, Dec) in degrees."""
    rng = np.random.default_rng(seed)
    ra = rng.uniform(0.0, 360.0, n)
    dec = np.degrees(np.arcsin(rng.uniform(-1.0, 1.0, n)))
    return ra, dec


# ---- raw pyerfa ------------------------------------------------------------------------


def _quiet(func, *args):
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", erfa.ErfaWarning)  # 'dubious year' past the table
        return func(*args)


def _steady_tai_utc():
    """True when TAI - UTC is one value over the whole log, so no log day is a UTC step
    day and a date-time value is ERFA's UTC quasi-JD as it stands (null JD + value)."""
    start = _quiet(erfa.dat, 2024, 1, 1, 0.0)
    end = _quiet(erfa.dat, 2027, 1, 1, 0.0)
    return start == end


def raw_utc(serials, null_jd=bench_recalc.DEFAULT_NULL_JD):
    """Two-part UTC quasi-JDs of date-time values, the cheapest correct way."""
    if not _steady_tai_utc():
        # A leap second inside the log: the calendar route of bench_recalc (dtf2d).
        whole = np.floor(serials)
        iy, im, iday, fd = _quiet(erfa.jd2cal, null_jd + whole, serials - whole)
        sec = fd * 86400.0
        hh = np.floor(sec / 3600.0)
        mm = np.floor((sec - hh * 3600.0) / 60.0)
        return _quiet(erfa.dtf2d, "UTC", iy, im, iday, hh.astype(int), mm.astype(int),
                      sec - hh * 3600.0 - mm * 60.0)
    whole = np.floor(serials)
    return null_jd + whole, serials - whole


def raw_tt(serials):
    return erfa.taitt(*_quiet(erfa.utctai, *raw_utc(serials)))


def _raw_ecliptic_date(ra, dec, serials, shared):
    bias = erfa.bp06(J2000_JD, 0.0)[0]  # ICRS -> mean equator and equinox of J2000.0
    if shared:
        tt1, tt2 = raw_tt(np.array([serials]))
        m = erfa.rxr(erfa.ecm06(tt1[0], tt2[0]), erfa.tr(bias))
    else:
        m = erfa.rxr(erfa.ecm06(*raw_tt(serials)), erfa.tr(bias))
    lon, lat = erfa.c2s(erfa.rxp(m, erfa.s2c(np.radians(ra), np.radians(dec))))
    return lon, lat


def raw_ecl_lon(ra, dec, serials, shared=False):
    return np.degrees(erfa.anp(_raw_ecliptic_date(ra, dec, serials, shared)[0]))


def raw_ecl_lat(ra, dec, serials, shared=False):
    return np.degrees(_raw_ecliptic_date(ra, dec, serials, shared)[1])


def raw_gal_lon(ra, dec):
    bias = erfa.bp06(J2000_JD, 0.0)[0]
    icrs = erfa.c2s(erfa.trxp(bias, erfa.s2c(np.radians(ra), np.radians(dec))))
    return np.degrees(erfa.anp(erfa.icrs2g(*icrs)[0]))


def _site():
    return np.radians(SITE_LON), np.radians(SITE_LAT), SITE_HEIGHT


def raw_altitude(ra, dec, serials):
    utc1, utc2 = raw_utc(serials)
    elong, phi, hm = _site()
    # no proper motion, parallax, radial velocity, DUT1, polar motion; no refraction
    _, zob, _, _, _, _ = _quiet(
        erfa.atco13, np.radians(ra), np.radians(dec), 0.0, 0.0, 0.0, 0.0, utc1, utc2, 0.0,
        elong, phi, hm, 0.0, 0.0, 0.0, 10.0, 0.5, 0.55)
    return 90.0 - np.degrees(zob)


def raw_altitude_shared(ra, dec, serial):
    utc1, utc2 = raw_utc(np.array([serial]))
    elong, phi, hm = _site()
    astrom, _eo = _quiet(erfa.apco13, utc1[0], utc2[0], 0.0, elong, phi, hm, 0.0, 0.0,
                         0.0, 10.0, 0.5, 0.55)
    ri, di = erfa.atciq(np.radians(ra), np.radians(dec), 0.0, 0.0, 0.0, 0.0, astrom)
    _, zob, _, _, _ = erfa.atioq(ri, di, astrom)
    return 90.0 - np.degrees(zob)


# ---- the core part ---------------------------------------------------------------------


def _column(values):
    return tuple((float(v),) for v in values)


def core_cases(n):
    """label -> (function name, evaluate args, raw callable, core-function callable).

    The core-function callable gets the arrays as the cell layer hands them over: time
    read into Instants, single values repeated per row."""
    ra, dec = sky_positions(n)
    serials = log_times(n, seed=2025)
    shared = float(serials[n // 2])
    col_ra, col_dec, col_t = _column(ra), _column(dec), _column(serials)

    def instants(values):
        jd1, jd2, _ = read_times(np.asarray(values, dtype=float).astype(object), "UTC",
                                 bench_recalc.DEFAULT_NULL_JD)
        return Instants(jd1, jd2, "UTC")

    t_rows = instants(serials)
    t_shared = instants(np.full(n, shared))
    given = np.ones(n, dtype=bool)
    lat, lon, height = np.full(n, SITE_LAT), np.full(n, SITE_LON), np.full(n, SITE_HEIGHT)
    site = (SITE_LAT, SITE_LON, "UTC", SITE_HEIGHT)
    ecl = (FROM, "ECLIPTIC DATE")
    return {
        "COORD.LON ecl date, distinct dates": (
            "SKY.COORD.LON", (col_ra, col_dec) + ecl + (col_t,),
            lambda: raw_ecl_lon(ra, dec, serials),
            lambda: frames.coord_lon_cells(ra, dec, *ecl, t_rows, given)),
        "COORD.LAT ecl date, distinct dates": (
            "SKY.COORD.LAT", (col_ra, col_dec) + ecl + (col_t,),
            lambda: raw_ecl_lat(ra, dec, serials),
            lambda: frames.coord_lat_cells(ra, dec, *ecl, t_rows, given)),
        "COORD.LON ecl date, one shared date": (
            "SKY.COORD.LON", (col_ra, col_dec) + ecl + (shared,),
            lambda: raw_ecl_lon(ra, dec, shared, shared=True),
            lambda: frames.coord_lon_cells(ra, dec, *ecl, t_shared, given)),
        "COORD.LAT ecl date, one shared date": (
            "SKY.COORD.LAT", (col_ra, col_dec) + ecl + (shared,),
            lambda: raw_ecl_lat(ra, dec, shared, shared=True),
            lambda: frames.coord_lat_cells(ra, dec, *ecl, t_shared, given)),
        "COORD.LON galactic (no date)": (
            "SKY.COORD.LON", (col_ra, col_dec, FROM, "GALACTIC"),
            lambda: raw_gal_lon(ra, dec),
            lambda: frames.coord_lon_cells(ra, dec, FROM, "GALACTIC", None, None)),
        "HORIZON.ALT, distinct times": (
            "SKY.HORIZON.ALT", (col_ra, col_dec, col_t) + site,
            lambda: raw_altitude(ra, dec, serials),
            lambda: horizon.altitude_cells(ra, dec, t_rows, lat, lon, height)),
        "HORIZON.ALT, one shared time": (
            "SKY.HORIZON.ALT", (col_ra, col_dec, shared) + site,
            lambda: raw_altitude_shared(ra, dec, shared),
            lambda: horizon.altitude_cells(ra, dec, t_shared, lat, lon, height)),
    }


def _top_functions(profile, count=8, cumulative=False):
    """The functions with the most own (or cumulative) time in a cProfile run, as
    (name, seconds, calls), and the profiled total."""
    stats = pstats.Stats(profile)
    rows = []
    for (path, line, name), (_cc, calls, own, cum, _callers) in stats.stats.items():
        if path == __file__ or name == "<method 'disable' of '_lsprof.Profiler' objects>":
            continue  # the benchmark's own loop
        where = f"{os.path.basename(path)}:{line}({name})" if line else name
        rows.append((where, cum if cumulative else own, calls))
    rows.sort(key=lambda r: -r[1])
    return rows[:count], stats.total_tt


def _lon_wrap_diff(a, b):
    d = np.abs(a - b)
    return np.minimum(d, 360.0 - d)


def core_part(core_rows, repeats, profile, report):
    out = {"rows": core_rows, "cases": {}}
    for label, (name, args, raw, core_fn) in core_cases(core_rows).items():
        ours_s, ours = best(lambda: evaluate(name, args), repeats)
        raw_s, ref = best(raw, repeats)
        fn_s, _ = best(core_fn, repeats)
        values = np.array([row[0] for row in ours], dtype=object)
        numeric = np.array([type(v) is float for v in values])
        got = values[numeric].astype(float)
        diff = (_lon_wrap_diff(got, ref[numeric]) if name == "SKY.COORD.LON"
                else np.abs(got - ref[numeric]))
        case = {
            "function": name, "ours_s": ours_s, "raw_s": raw_s, "core_fn_s": fn_s,
            "ratio": ours_s / raw_s, "core_fn_ratio": fn_s / raw_s,
            "max_abs_diff_arcsec": float(diff.max()) * 3600.0 if diff.size else None,
            "non_numeric_rows": int((~numeric).sum()),
            "non_numeric_example": values[~numeric][0] if (~numeric).any() else None,
        }
        if profile:
            prof = cProfile.Profile()
            prof.runcall(evaluate, name, args)
            top, total = _top_functions(prof)
            case["profile_total_s"] = total
            case["profile_top"] = top
        out["cases"][label] = case
        report(f"  core {label:38s} ours {ours_s:7.3f} s  core fn {fn_s:7.3f} s  "
               f"raw {raw_s:7.3f} s")
    return out


def single_cell_part(n, profile, report):
    """The path a per-cell formula takes, without the office: one ``evaluate`` per cell
    on the office part's inputs, cache emptied first (cold), then again (warm)."""
    from calcfuncs import cells

    ra, dec = sky_positions(n, seed=2027)
    serials = log_times(n)
    site = (SITE_LAT, SITE_LON, "UTC", SITE_HEIGHT)
    calls = {
        LABELS[0]: ("SKY.COORD.LON", lambda i: (ra[i], dec[i], FROM, "ECLIPTIC DATE", serials[i])),
        LABELS[1]: ("SKY.COORD.LAT", lambda i: (ra[i], dec[i], FROM, "ECLIPTIC DATE", serials[i])),
        LABELS[2]: ("SKY.COORD.LON", lambda i: (ra[i], dec[i], FROM, "GALACTIC")),
        LABELS[3]: ("SKY.HORIZON.ALT", lambda i: (ra[i], dec[i], serials[i]) + site),
    }
    arguments = {label: (name, [tuple(float(v) if isinstance(v, np.floating) else v
                                      for v in make(i)) for i in range(n)])
                 for label, (name, make) in calls.items()}

    def run(name, rows):
        for args in rows:
            evaluate(name, args)

    out = {"rows": n, "cold_us": {}, "warm_us": {}}
    cells._SINGLE_CELL_CACHE.clear()  # private, but this is the cache being measured
    for label, (name, rows) in arguments.items():
        t0 = time.perf_counter()
        run(name, rows)
        out["cold_us"][label] = _us(time.perf_counter() - t0, n)
    for label, (name, rows) in arguments.items():
        t0 = time.perf_counter()
        run(name, rows)
        out["warm_us"][label] = _us(time.perf_counter() - t0, n)
    if profile:
        cells._SINGLE_CELL_CACHE.clear()
        out["profile"] = {}
        for label in (LABELS[0], LABELS[3]):
            name, rows = arguments[label]
            prof = cProfile.Profile()
            prof.runcall(run, name, rows)
            top, total = _top_functions(prof, 14, cumulative=True)
            out["profile"][label] = {"total_s": total, "top": top}
        cells._SINGLE_CELL_CACHE.clear()
    report("  core single-cell " + ", ".join(
        f"{k} {v:.0f}" for k, v in out["cold_us"].items()) + " us/cell cold")
    return out


# ---- the office part -------------------------------------------------------------------


def ours_formulas(r):
    """Row ``r`` of the four benchmarked columns (A time, B RA, C Dec)."""
    a, b, c = f"A{r}", f"B{r}", f"C{r}"
    return (
        f'=SKY.COORD.LON({b};{c};"{FROM}";"ECLIPTIC DATE";{a})',
        f'=SKY.COORD.LAT({b};{c};"{FROM}";"ECLIPTIC DATE";{a})',
        f'=SKY.COORD.LON({b};{c};"{FROM}";"GALACTIC")',
        f'=SKY.HORIZON.ALT({b};{c};{a};{SITE_LAT!r};{SITE_LON!r};"UTC";{SITE_HEIGHT!r})',
    )


def native_formulas(r, null_jd):
    """Calc's own low-precision equivalents of ``ours_formulas`` for row ``r``.

    Ecliptic: tan(lambda) = (sin(a) cos(e) + tan(d) sin(e)) / cos(a) and
    sin(beta) = sin(d) cos(e) - cos(d) sin(e) sin(a) with e fixed at 23.4393 deg, plus the
    general precession in longitude, 1.3969713 deg per Julian century (from memory).
    Galactic: the J2000 north galactic pole at RA 192.85948, Dec 27.12825 and the
    galactic longitude of the north celestial pole 122.93192 (Hipparcos values, from
    memory).  Altitude: GMST = 280.46061837 + 360.98564736629 (JD - 2451545) deg (Meeus,
    Astronomical Algorithms 12.4 without the T^2 terms, from memory) with UTC for UT1,
    then sin(h) = sin(phi) sin(d) + cos(phi) cos(d) cos(H); no precession, nutation,
    aberration or refraction.
    """
    a, b, c = f"A{r}", f"B{r}", f"C{r}"
    jd = f"({a}+{null_jd!r})"
    t = f"(({jd}-{J2000_JD!r})/36525)"
    e = "RADIANS(23.4393)"
    ra, dec = f"RADIANS({b})", f"RADIANS({c})"
    dra = f"RADIANS({b}-192.85948)"
    pole = "RADIANS(27.12825)"
    phi = f"RADIANS({SITE_LAT!r})"
    hour = f"RADIANS(280.46061837+360.98564736629*({jd}-{J2000_JD!r})+{SITE_LON!r}-{b})"
    return (
        f"=MOD(DEGREES(ATAN2(COS({ra});SIN({ra})*COS({e})+TAN({dec})*SIN({e})))"
        f"+1.3969713*{t};360)",
        f"=DEGREES(ASIN(SIN({dec})*COS({e})-COS({dec})*SIN({e})*SIN({ra})))",
        f"=MOD(122.93192-DEGREES(ATAN2(SIN({dec})*COS({pole})-COS({dec})*SIN({pole})"
        f"*COS({dra});COS({dec})*SIN({dra})));360)",
        f"=DEGREES(ASIN(SIN({phi})*SIN({dec})+COS({phi})*COS({dec})*COS({hour})))",
    )


LABELS = ("COORD.LON ecl date", "COORD.LAT ecl date", "COORD.LON galactic", "HORIZON.ALT")
LON_COLUMNS = (0, 2)  # angles that wrap at 360


def office_cases(n):
    """name -> (description, formulas of row r (r, null_jd) or None, array formulas)."""
    last = n + 1
    a, b, c = f"A2:A{last}", f"B2:B{last}", f"C2:C{last}"
    column = (
        f'=SKY.COORD.LON({b};{c};"{FROM}";"ECLIPTIC DATE";{a})',
        f'=SKY.COORD.LAT({b};{c};"{FROM}";"ECLIPTIC DATE";{a})',
        f'=SKY.COORD.LON({b};{c};"{FROM}";"GALACTIC")',
        f'=SKY.HORIZON.ALT({b};{c};{a};{SITE_LAT!r};{SITE_LON!r};"UTC";{SITE_HEIGHT!r})',
    )
    return {
        "per_cell": ("per-cell COORD.LON/LAT ecl, LON gal, HORIZON.ALT",
                     lambda r, nj: ours_formulas(r), None),
        "column": ("whole-column, 4 array formulas", None, column),
        "floor_version": ("floor: =SKY.VERSION() per cell",
                          lambda r, nj: ("=SKY.VERSION()",) * 4, None),
        "native": ("native Calc low-precision formulas", native_formulas, None),
    }


def _first_call(office, probe_time):
    """The first add-in calls import numpy, erfa and the core: timed apart, at a time
    outside the log so that no benchmarked cell is cached by them."""
    doc = office.new_sheet()
    try:
        sheet = doc.Sheets.getByIndex(0)
        for k, v in enumerate((probe_time, 201.5, -33.25)):
            sheet.getCellByPosition(k, 0).setValue(v)
        formulas = ours_formulas(1) + ("=SKY.VERSION()",)
        t0 = time.perf_counter()
        for k, formula in enumerate(formulas):
            sheet.getCellByPosition(3 + k, 0).setFormula(formula)
        first = sheet.getCellByPosition(3, 0).getValue()
        elapsed = time.perf_counter() - t0
        return elapsed, first, sheet.getCellByPosition(3 + len(formulas) - 1, 0).getString()
    finally:
        doc.close(True)


def run_office_case(office, inputs, per_row, array_formulas, warm_repeats, text_prefix=None):
    """Seconds to set, recalculate cold and warm (best of ``warm_repeats``) one case in
    a fresh document (time, RA and Dec in columns A to C); the cells it computed."""
    return bench_recalc.office_case(office, list(inputs), per_row, array_formulas,
                                    warm_repeats, text_prefix)
def _diff_arcsec(a, b, k, how=np.max):
    """``how`` (max, median) of |a - b| over the rows where both are numbers, in arcsec
    (None if none).  Longitudes near a pole of their system differ much more than the
    directions do, so the median says more than the max for the native formulas."""
    pairs = [(x[k], y[k]) for x, y in zip(a, b)
             if isinstance(x[k], float) and isinstance(y[k], float)]
    if not pairs:
        return None
    x, y = np.array(pairs).T
    d = _lon_wrap_diff(x, y) if k in LON_COLUMNS else np.abs(x - y)
    return float(how(d)) * 3600.0


def _core_reference(inputs, null_date):
    """The four columns as the core computes them here, row tuples like getDataArray."""
    times, ra, dec = inputs
    cr, cd, ct = _column(ra), _column(dec), _column(times)
    site = (SITE_LAT, SITE_LON, "UTC", SITE_HEIGHT)
    cols = (
        evaluate("SKY.COORD.LON", (cr, cd, FROM, "ECLIPTIC DATE", ct), null_date),
        evaluate("SKY.COORD.LAT", (cr, cd, FROM, "ECLIPTIC DATE", ct), null_date),
        evaluate("SKY.COORD.LON", (cr, cd, FROM, "GALACTIC"), null_date),
        evaluate("SKY.HORIZON.ALT", (cr, cd, ct) + site, null_date),
    )
    return tuple(tuple(col[i][0] for col in cols) for i in range(len(times)))


def office_part(oxt, n, warm_repeats, report):
    from officekit import Office

    ra, dec = sky_positions(n, seed=2027)
    inputs = (log_times(n), ra, dec)
    out = {"rows": n}
    t0 = time.perf_counter()
    with Office(oxt=oxt) as office:
        out["office_start_s"] = time.perf_counter() - t0
        out["office"] = _office_version(office)
        first_s, first_value, version = _first_call(office, bench_recalc.LOG_START - 400.25)
        out.update(first_call_s=first_s, first_call_value=first_value, addin_version=version)
        report(f"office up in {out['office_start_s']:.1f} s ({out['office']}); first add-in "
               f"calls {first_s:.2f} s; SKY.VERSION() = {version!r}")
        results, data = {}, {}
        for name, (label, per_row, arrays) in office_cases(n).items():
            prefix = "Eclipsheet " if name == "floor_version" else None
            res, data[name] = run_office_case(office, inputs, per_row, arrays, warm_repeats,
                                              prefix)
            res["label"] = label
            results[name] = res
            report(f"  {name:14s} set {res['set_s']:6.2f} s  cold {res['cold_s']:7.3f} s  "
                   f"warm {min(res['warm_all_s']):7.3f}-{max(res['warm_all_s']):.3f} s  "
                   f"unexpected cells {res['unexpected_cells']}")
        out["cases"] = results
        # Every timed cell against the core computed here (not a test: a wrong cell
        # would make its timing meaningless, so the report flags it).
        core = _core_reference(inputs, tuple(results["per_cell"]["null_date"]))
        out["agreement_arcsec"] = {
            label: {
                "per_cell_vs_core": _diff_arcsec(data["per_cell"], core, k),
                "column_vs_core": _diff_arcsec(data["column"], core, k),
                "native_vs_core": _diff_arcsec(data["native"], core, k),
                "native_vs_core_median": _diff_arcsec(data["native"], core, k, np.median),
            }
            for k, label in enumerate(LABELS)
        }
    return out


# ---- the report ------------------------------------------------------------------------


def _fmt(v, spec):
    return "-" if v is None else format(v, spec)


def table(result):
    lines = []
    core = result.get("core_part")
    single = result.get("single_cell")
    if core:
        n = core["rows"]
        lines.append(f"core, {n} rows, no office (Python {result['python']}, numpy "
                     f"{result['numpy']}, pyerfa {result['pyerfa']}; best of "
                     f"{result['repeats']}); issue target: ours/raw <= {TARGET_RATIO}")
        lines.append(f"{'case':38s} {'ours s':>7s} {'core fn':>7s} {'raw s':>7s} "
                     f"{'ours/raw':>8s} {'fn/raw':>6s} {'us/row':>7s} {'max|d| as':>9s}")
        for label, c in core["cases"].items():
            flag = "" if c["non_numeric_rows"] == 0 else (
                f"  !! {c['non_numeric_rows']} rows not numbers, e.g. "
                f"{c['non_numeric_example']!r}")
            lines.append(
                f"{label:38s} {c['ours_s']:7.3f} {c['core_fn_s']:7.3f} {c['raw_s']:7.3f} "
                f"{c['ratio']:8.2f} {c['core_fn_ratio']:6.2f} {_us(c['ours_s'], n):7.2f} "
                f"{_fmt(c['max_abs_diff_arcsec'], '9.1e')}{flag}")
        lines.append("(ours = evaluate on whole columns; core fn = calcfuncs.frames/horizon "
                     "on arrays already read; raw = pyerfa alone)")
    if single:
        lines.append("")
        lines.append(f"core single-cell evaluate (this Python), {single['rows']} cells per "
                     "function, us/cell:")
        for label, cold in single["cold_us"].items():
            lines.append(f"  {label:20s} cold {cold:7.1f}  warm {single['warm_us'][label]:6.2f}")
    off = result.get("office_part")
    if off:
        n = off["rows"]
        lines.append("")
        lines.append(f"Office: {off['office']}; {n} rows x 4 columns = {4 * n} cells per case; "
                     f"add-in {off['addin_version']}")
        lines.append(f"office start + install {off['office_start_s']:.1f} s; first add-in calls "
                     f"(import the core) {off['first_call_s']:.2f} s")
        lines.append(f"{'case (warm: best of repeats)':50s} {'cold s':>8s} {'us/cell':>8s} "
                     f"{'warm s':>8s} {'us/cell':>8s} {'set s':>6s}")
        for c in off["cases"].values():
            flag = "" if c["unexpected_cells"] == 0 else (
                f"  !! {c['unexpected_cells']} unexpected cells, e.g. {c['unexpected_example']!r}")
            lines.append(
                f"{c['label']:50s} {c['cold_s']:8.3f} {_us(c['cold_s'], c['cells']):8.1f} "
                f"{c['warm_s']:8.3f} {_us(c['warm_s'], c['cells']):8.1f} {c['set_s']:6.2f}{flag}")
        lines.append("")
        lines.append("agreement of the timed cells with the core run here (max |difference|, "
                     "arcsec; not a test):")
        for label, a in off["agreement_arcsec"].items():
            lines.append(f"  {label:20s} per-cell {_fmt(a['per_cell_vs_core'], '.2g')}  "
                         f"column {_fmt(a['column_vs_core'], '.2g')}  native "
                         f"{_fmt(a['native_vs_core'], '.3g')} (median "
                         f"{_fmt(a['native_vs_core_median'], '.3g')})")
    rat = result.get("ratios")
    if rat:
        lines.append("")
        lines.append("ratios (of seconds for the same cells):")
        for k, v in rat.items():
            lines.append(f"  {k:52s} {v:8.2f}")
    if core and any("profile_top" in c for c in core["cases"].values()):
        lines.append("")
        lines.append("profile of one column evaluate per core case (cProfile, which inflates "
                     "Python-level calls; own time, top functions):")
        for label, c in core["cases"].items():
            lines.append(f"  {label} (profiled total {c['profile_total_s']:.3f} s)")
            for where, own, calls in c["profile_top"]:
                lines.append(f"    {own:7.3f} s {100 * own / c['profile_total_s']:5.1f}% "
                             f"{calls:>8d} calls  {where}")
    if single and "profile" in single:
        lines.append("")
        lines.append("profile of the single-cell path, cold (cProfile; CUMULATIVE time, so "
                     "nested rows overlap):")
        for label, p in single["profile"].items():
            lines.append(f"  {label} x {single['rows']} (profiled total {p['total_s']:.3f} s)")
            for where, own, calls in p["top"]:
                lines.append(f"    {own:7.3f} s {100 * own / p['total_s']:5.1f}% "
                             f"{calls:>8d} calls  {where}")
    return "\n".join(lines)


def ratios(result):
    out = {}
    off = result.get("office_part")
    if off:
        c = off["cases"]
        for phase in ("cold", "warm"):
            pc = c["per_cell"][f"{phase}_s"]
            out[f"per-cell / floor SKY.VERSION ({phase})"] = pc / c["floor_version"][f"{phase}_s"]
            out[f"column / per-cell ({phase})"] = c["column"][f"{phase}_s"] / pc
            out[f"column / floor SKY.VERSION ({phase})"] = (
                c["column"][f"{phase}_s"] / c["floor_version"][f"{phase}_s"])
            out[f"ours per-cell / native ({phase})"] = pc / c["native"][f"{phase}_s"]
            out[f"ours column / native ({phase})"] = c["column"][f"{phase}_s"] / c["native"][
                f"{phase}_s"]
        out["per-cell cold / per-cell warm"] = c["per_cell"]["cold_s"] / c["per_cell"]["warm_s"]
    core = result.get("core_part")
    if core:
        for label, case in core["cases"].items():
            out[f"core / raw pyerfa, {label}"] = case["ratio"]
    return out


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--oxt", default=os.path.join(ROOT, "dist", "eclipsheet.oxt"))
    parser.add_argument("--rows", type=int, default=10_000, help="sheet rows (default 10000)")
    parser.add_argument("--core-rows", type=int, default=100_000,
                        help="rows of the core-vs-pyerfa comparison (default 100000)")
    parser.add_argument("--repeats", type=int, default=3,
                        help="warm recalculations per case and core repeats, best kept "
                        "(default 3)")
    parser.add_argument("--no-office", action="store_true", help="only the core part")
    parser.add_argument("--profile", action="store_true",
                        help="also profile one evaluate per core case (cProfile)")
    parser.add_argument("--json", metavar="FILE", help="also write the numbers to FILE")
    args = parser.parse_args(argv)

    def report(msg):
        print(msg, file=sys.stderr, flush=True)

    result = {
        "python": platform.python_version(), "numpy": np.__version__,
        "pyerfa": erfa.__version__, "machine": f"{platform.machine()}, {os.cpu_count()} CPUs",
        "repeats": args.repeats,
    }
    started = time.perf_counter()
    result["core_part"] = core_part(args.core_rows, args.repeats, args.profile, report)
    result["single_cell"] = single_cell_part(args.rows, args.profile, report)
    if not args.no_office:
        if not os.path.exists(args.oxt):
            parser.error(f"{args.oxt} not found; build it with: "
                         ".venv/bin/python extension/build.py oxt")
        stale = bench_recalc.stale_in_oxt(args.oxt)
        if stale:
            report(f"warning: {args.oxt} differs from the sources ({', '.join(stale)}); "
                   "rebuild it")
        result["oxt_differs_from_sources"] = stale
        result["office_part"] = office_part(args.oxt, args.rows, args.repeats, report)
    result["ratios"] = ratios(result)
    result["total_s"] = time.perf_counter() - started
    print(table(result))
    print(f"\ntotal {result['total_s']:.0f} s", flush=True)
    if args.json:
        save_figures(args.json, result)
    return 0


if __name__ == "__main__":
    sys.exit(main())
