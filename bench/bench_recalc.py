"""How long Calc takes to recalculate Eclipsheet cells, and what the time is spent on.

A benchmark, not a test: it prints numbers and asserts nothing about speed.

    .venv/bin/python bench/bench_recalc.py --oxt dist/eclipsheet.oxt [--rows 10000]
                                           [--core-rows 100000] [--json out.json]

Office part (a real headless LibreOffice with the .oxt installed, one fresh document
per case, automatic calculation off so that the first ``calculateAll()`` after the
formulas are set is the cold one):

  1 per-cell     one SKY.JD (UTC to TT), SKY.MJD, SKY.OBLIQUITY, SKY.OBLIQUITY.TRUE
                 formula per row
  2 column       the same four functions as one array formula per column
  3 floor        a trivial add-in call in every cell: SKY.VERSION() (cached text) and
                 SKY.WRAP.360 of the time value (a cheap numeric call)
  4 native       Calc's own formulas for low-precision equivalents

``calcfuncs.cells`` keeps the results of single-cell calls keyed by their arguments,
so a repeated ``calculateAll()`` of the same cells (warm) is much cheaper than the first
one (cold).  Both are measured; every time value is distinct, so a cold run misses.

Core part (no office, this Python): the whole-column path of ``evaluate`` against the
same work done with direct pyerfa calls, and the single-cell path of ``evaluate``.

The time values are an invented observing log: the patrol camera of an invented
club's variable-star watch, 2024-2026, one entry about every 2.6 hours (UTC).
"""

import argparse
import os
import platform
import statistics
import sys
import time
import warnings

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)
sys.path.insert(0, os.path.join(ROOT, "tools"))

import erfa  # noqa: E402
import numpy as np  # noqa: E402

from timing import best, save_figures  # noqa: E402

from calcfuncs import cells  # noqa: E402

# Calc date-time values (days since the default null date 1899-12-30) of
# 2024-01-01T00:00 and 2027-01-01T00:00 UTC.
LOG_START = 45292.0
LOG_END = 46388.0
DEFAULT_NULL_JD = 2415018.5  # JD of 1899-12-30 0h, Calc's default null date
J2000_JD = 2451545.0
# TT - UTC = 32.184 s + 37 s (TAI - UTC since 2017-01-01), constant over the log.
TT_MINUS_UTC_DAYS = "69.184/86400"

OURS = (
    ("SKY.JD TT", 'SKY.JD({a};"UTC";"TT")'),
    ("SKY.MJD", "SKY.MJD({a})"),
    ("SKY.OBLIQUITY", "SKY.OBLIQUITY({a})"),
    ("SKY.OBLIQUITY.TRUE", "SKY.OBLIQUITY.TRUE({a})"),
)


def log_times(n, seed=2024, start=LOG_START, end=LOG_END):
    """``n`` distinct UTC date-time values spread over 2024-2026 (or ``start`` to
    ``end``, date-time values), to the millisecond.

    Evenly spaced slots with a jitter under half a slot, so no two rows are equal.
    """
    rng = np.random.default_rng(seed)
    step = (end - start) / n
    base = start + step * (np.arange(n) + 0.5)
    t = base + rng.uniform(-0.4, 0.4, n) * step
    return np.round(t * 86400_000.0) / 86400_000.0


def _native_formulas(a, null_jd):
    """Low-precision Calc formulas for the four columns of ``OURS``.

    JD(TT) and MJD(UTC) by adding constants; mean obliquity as the linear part of the
    IAU 1980 formula (23.439291 deg - 46.8150"/century); true obliquity adding the main
    nutation term, 0.00256 deg cos(Omega) with Omega = 125.04 - 1934.136 T degrees
    (the low-precision correction in Meeus, Astronomical Algorithms; from memory).
    """
    jd = f"({a}+{null_jd!r})"
    t = f"(({jd}-{J2000_JD!r})/36525)"
    mean = f"(23.439291-0.0130042*{t})"
    return (
        f"={jd}+{TT_MINUS_UTC_DAYS}",
        f"={a}+{null_jd - 2400000.5!r}",
        f"={mean}",
        f"={mean}+0.00256*COS(RADIANS(125.04-1934.136*{t}))",
    )


def office_cases(n):
    """name -> (description, formulas for row r as a function, or array formulas)."""
    last = n + 1
    column = tuple("=" + f.format(a=f"A2:A{last}") for _, f in OURS)
    return {
        "per_cell": ("per-cell SKY.JD/MJD/OBLIQUITY/OBLIQUITY.TRUE",
                     lambda r, nj: tuple("=" + f.format(a=f"A{r}") for _, f in OURS), None),
        "column": ("whole-column, 4 array formulas", None, column),
        "floor_version": ("floor: =SKY.VERSION() per cell",
                          lambda r, nj: ("=SKY.VERSION()",) * 4, None),
        "floor_wrap": ("floor: =SKY.WRAP.360(A+k) per cell",
                       lambda r, nj: (f"=SKY.WRAP.360(A{r})",) + tuple(
                           f"=SKY.WRAP.360(A{r}+{k})" for k in (1, 2, 3)), None),
        "native": ("native Calc low-precision formulas",
                   lambda r, nj: _native_formulas(f"A{r}", nj), None),
    }


# ---- the office part -------------------------------------------------------------------


def _office_version(office):
    try:
        from officekit import _props

        provider = office.service("com.sun.star.configuration.ConfigurationProvider")
        access = provider.createInstanceWithArguments(
            "com.sun.star.configuration.ConfigurationAccess",
            _props(nodepath="/org.openoffice.Setup/Product"),
        )
        return f"{access.getByName('ooName')} {access.getByName('ooSetupVersionAboutBox')}"
    except Exception as err:  # only a label in the report
        return f"unknown ({type(err).__name__})"


def _check_cells(data, text_prefix=None):
    """(unexpected cells, first such value) of a getDataArray result: cells that are
    not numbers, or with ``text_prefix`` cells that are not text starting with it."""
    if text_prefix is None:
        bad = [v for row in data for v in row if not isinstance(v, float)]
    else:
        bad = [v for row in data for v in row
               if not (isinstance(v, str) and v.startswith(text_prefix))]
    return len(bad), (bad[0] if bad else None)


def _first_call(office, probe_time):
    """The office's first add-in calls import numpy, erfa and the core modules: time
    them apart, on a time value outside the log so no benchmark cell is pre-cached."""
    doc = office.new_sheet()
    try:
        sheet = doc.Sheets.getByIndex(0)
        sheet.getCellByPosition(0, 0).setValue(probe_time)
        formulas = ["=" + f.format(a="A1") for _, f in OURS]
        formulas += ["=SKY.WRAP.360(A1)", "=SKY.VERSION()"]
        t0 = time.perf_counter()
        for k, formula in enumerate(formulas):
            sheet.getCellByPosition(1 + k, 0).setFormula(formula)
        first = sheet.getCellByPosition(1, 0).getValue()
        elapsed = time.perf_counter() - t0
        return elapsed, first, sheet.getCellByPosition(len(formulas), 0).getString()
    finally:
        doc.close(True)


def run_office_case(office, times, per_row, array_formulas, warm_repeats, text_prefix=None):
    """Seconds to set, first recalculate (cold) and recalculate again (warm, best of
    ``warm_repeats``) one case in a fresh document, and the cells it computed."""
    return office_case(office, [times], per_row, array_formulas, warm_repeats, text_prefix)


def office_case(office, columns, per_row, array_formulas, warm_repeats, text_prefix=None):
    """``run_office_case`` for input columns from A on (numbers, one list a column) and
    four formula columns right of them: row 2's formulas ``per_row(2, null_jd)`` filled
    down, or ``array_formulas`` one per formula column."""
    from com.sun.star.sheet.FillDirection import TO_BOTTOM as FILL_TO_BOTTOM
    from officekit import null_date

    n = len(columns[0])
    first = len(columns)  # the first formula column (0-based)
    doc = office.new_sheet()
    try:
        nd = null_date(doc)
        null_jd = float(sum(erfa.cal2jd(*nd)))
        sheet = doc.Sheets.getByIndex(0)
        doc.enableAutomaticCalculation(False)
        sheet.getCellRangeByPosition(0, 1, first - 1, n).setDataArray(
            tuple(tuple(float(v) for v in row) for row in zip(*columns)))
        target = sheet.getCellRangeByPosition(first, 1, first + 3, n)
        t0 = time.perf_counter()
        if array_formulas is None:
            # Row 2 filled down, as a user would: setFormulaArray with one formula text
            # per cell costs Calc about 0.25 ms a formula to compile, far more than the
            # recalculation being measured, and gives the same formulas.
            sheet.getCellRangeByPosition(first, 1, first + 3, 1).setFormulaArray(
                (per_row(2, null_jd),))
            target.fillAuto(FILL_TO_BOTTOM, 1)
        else:
            for k, formula in enumerate(array_formulas):
                sheet.getCellRangeByPosition(first + k, 1, first + k, n).setArrayFormula(formula)
        set_s = time.perf_counter() - t0

        t0 = time.perf_counter()
        doc.calculateAll()
        cold = time.perf_counter() - t0
        warm = []
        for _ in range(warm_repeats):
            t0 = time.perf_counter()
            doc.calculateAll()
            warm.append(time.perf_counter() - t0)
        data = target.getDataArray()
        bad, example = _check_cells(data, text_prefix)
        return {
            "cells": 4 * n,
            "set_s": set_s,
            "cold_s": cold,
            "warm_s": min(warm) if warm else None,
            "warm_median_s": statistics.median(warm) if warm else None,
            "warm_all_s": warm,
            "unexpected_cells": bad,
            "unexpected_example": example,
            "null_date": list(nd),
        }, data
    finally:
        doc.close(True)


def _max_abs_diff(a, b, column, scale=1.0):
    x = np.array([row[column] for row in a], dtype=object)
    y = np.array([row[column] for row in b], dtype=object)
    ok = np.array([isinstance(u, float) and isinstance(v, float) for u, v in zip(x, y)])
    if not ok.any():
        return None
    return float(np.max(np.abs(x[ok].astype(float) - y[ok].astype(float)))) * scale


def office_part(oxt, n, warm_repeats, report):
    from officekit import Office

    times = log_times(n)
    out = {"rows": n}
    t0 = time.perf_counter()
    with Office(oxt=oxt) as office:
        out["office_start_s"] = time.perf_counter() - t0
        out["office"] = _office_version(office)
        first_s, first_value, version = _first_call(office, LOG_START - 400.25)
        out["first_call_s"] = first_s
        out["first_call_value"] = first_value
        out["addin_version"] = version
        report(f"office up in {out['office_start_s']:.1f} s ({out['office']}); first add-in "
               f"calls {first_s:.2f} s; SKY.VERSION() = {version!r}")
        results = {}
        data = {}
        for name, (label, per_row, arrays) in office_cases(n).items():
            prefix = "Eclipsheet " if name == "floor_version" else None
            res, data[name] = run_office_case(office, times, per_row, arrays, warm_repeats,
                                              prefix)
            res["label"] = label
            results[name] = res
            report(f"  {name:14s} set {res['set_s']:6.2f} s  cold {res['cold_s']:7.3f} s  "
                   f"warm {min(res['warm_all_s']):7.3f}-{max(res['warm_all_s']):.3f} s  "
                   f"unexpected cells {res['unexpected_cells']}")
        out["cases"] = results
        # Agreement, to be sure the timed cells computed what they should (not a test).
        agree = {}
        for k, (label, _f) in enumerate(OURS):
            scale = 86400.0 if k < 2 else 3600.0  # JD/MJD in seconds, angles in arcsec
            agree[label] = {
                "column_vs_per_cell": _max_abs_diff(data["column"], data["per_cell"], k, scale),
                "native_vs_per_cell": _max_abs_diff(data["native"], data["per_cell"], k, scale),
                "unit": "s" if k < 2 else "arcsec",
            }
        out["agreement"] = agree
    return out


# ---- the core part ---------------------------------------------------------------------


def raw_tt(serials, null_jd=DEFAULT_NULL_JD):
    """UTC date-time values to two-part TT JDs with pyerfa alone: calendar fields
    (jd2cal), then dtf2d, utctai, taitt."""
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", erfa.ErfaWarning)  # 'dubious year' past the table
        whole = np.floor(serials)
        iy, im, iday, fd = erfa.jd2cal(null_jd + whole, serials - whole)
        sec = fd * 86400.0
        hh = np.floor(sec / 3600.0)
        mm = np.floor((sec - hh * 3600.0) / 60.0)
        ss = sec - hh * 3600.0 - mm * 60.0
        u1, u2 = erfa.dtf2d("UTC", iy, im, iday, hh.astype(int), mm.astype(int), ss)
        a1, a2 = erfa.utctai(u1, u2)
        return erfa.taitt(a1, a2)


def raw_jd(serials):
    t1, t2 = raw_tt(serials)
    return t1 + t2


def raw_obliquity(serials):
    return np.degrees(erfa.obl06(*raw_tt(serials)))


def raw_true_obliquity(serials):
    t1, t2 = raw_tt(serials)
    return np.degrees(erfa.obl06(t1, t2) + erfa.nut06a(t1, t2)[1])


CORE = (
    ("SKY.JD UTC->TT", "SKY.JD", ("UTC", "TT"), raw_jd, 86400.0, "s"),
    ("SKY.OBLIQUITY", "SKY.OBLIQUITY", (), raw_obliquity, 3600.0, "arcsec"),
    ("SKY.OBLIQUITY.TRUE", "SKY.OBLIQUITY.TRUE", (), raw_true_obliquity, 3600.0, "arcsec"),
)


def core_part(core_rows, cell_rows, repeats, report):
    serials = log_times(core_rows, seed=2025)
    column = tuple((float(v),) for v in serials)
    out = {"rows": core_rows, "columns": {}}
    for label, name, extra, raw, scale, unit in CORE:
        ours_s, ours = best(lambda: cells.evaluate(name, (column,) + extra), repeats)
        raw_s, ref = best(lambda: raw(serials), repeats)
        ours = np.array([row[0] for row in ours], dtype=object)
        numeric = np.array([isinstance(v, float) for v in ours])
        diff = float(np.max(np.abs(ours[numeric].astype(float) - ref[numeric]))) * scale
        out["columns"][label] = {
            "ours_s": ours_s, "raw_s": raw_s, "ratio": ours_s / raw_s,
            "max_abs_diff": diff, "unit": unit, "non_numeric_rows": int((~numeric).sum()),
        }
        report(f"  core {label:20s} ours {ours_s:7.3f} s  raw {raw_s:7.3f} s")

    # The single-cell path the office takes, without the office: cache emptied first.
    few = log_times(cell_rows)
    calls = (("SKY.JD", ("UTC", "TT")), ("SKY.MJD", ()), ("SKY.OBLIQUITY", ()),
             ("SKY.OBLIQUITY.TRUE", ()))
    per_function = {}
    cells._SINGLE_CELL_CACHE.clear()  # private, but this is the cache being measured
    total_cold = 0.0
    for name, args in calls:
        t0 = time.perf_counter()
        for v in few:
            cells.evaluate(name, (float(v),) + args)
        elapsed = time.perf_counter() - t0
        per_function[name] = elapsed / cell_rows * 1e6
        total_cold += elapsed
    t0 = time.perf_counter()
    for name, args in calls:
        for v in few:
            cells.evaluate(name, (float(v),) + args)
    total_warm = time.perf_counter() - t0
    n_cells = cell_rows * len(calls)
    out["single_cell"] = {
        "cells": n_cells,
        "cold_s": total_cold,
        "warm_s": total_warm,
        "cold_us_per_cell_by_function": per_function,
        "cache_size": cells._SINGLE_CELL_CACHE.size,
    }
    report(f"  core single-cell {n_cells} cells: cold {total_cold:.2f} s  warm {total_warm:.3f} s")
    return out


# ---- the report ------------------------------------------------------------------------


def _us(seconds, count):
    return seconds / count * 1e6


def table(result):
    lines = []
    off = result.get("office_part")
    if off:
        n = off["rows"]
        lines.append(f"Office: {off['office']}; {n} rows x 4 columns = {4 * n} cells per case; "
                     f"add-in {off['addin_version']}")
        lines.append(f"office start + install {off['office_start_s']:.1f} s; first add-in calls "
                     f"(import the core) {off['first_call_s']:.2f} s")
        lines.append("")
        lines.append(f"{'case (warm: best of repeats)':48s} {'cold s':>8s} {'us/cell':>8s} "
                     f"{'warm s':>8s} {'us/cell':>8s} {'set s':>6s}")
        for name, c in off["cases"].items():
            flag = "" if c["unexpected_cells"] == 0 else (
                f"  !! {c['unexpected_cells']} unexpected cells, e.g. {c['unexpected_example']!r}")
            lines.append(
                f"{c['label']:48s} {c['cold_s']:8.3f} {_us(c['cold_s'], c['cells']):8.1f} "
                f"{c['warm_s']:8.3f} {_us(c['warm_s'], c['cells']):8.1f} {c['set_s']:6.2f}{flag}"
            )
        cache_size = result["core_part"]["single_cell"]["cache_size"]
        if 4 * n > cache_size:
            lines.append(f"note: {4 * n} per-cell results exceed the single-cell cache "
                         f"({cache_size}); 'warm' is not warm")
        lines.append("")
        lines.append("agreement of the timed cells (max |difference|, not a test):")
        for label, a in off["agreement"].items():
            col = a["column_vs_per_cell"]
            nat = a["native_vs_per_cell"]
            lines.append(f"  {label:20s} column vs per-cell {col if col is None else f'{col:.3g}'} "
                         f"{a['unit']}; native vs ours {nat if nat is None else f'{nat:.3g}'} "
                         f"{a['unit']}")
    core = result.get("core_part")
    if core:
        lines.append("")
        lines.append(f"core, {core['rows']} rows, no office "
                     f"(numpy {np.__version__}, pyerfa {erfa.__version__}):")
        lines.append(f"{'function':22s} {'ours s':>8s} {'raw s':>8s} {'ours/raw':>9s} "
                     f"{'us/row ours':>12s} {'max |diff|':>12s}")
        for label, c in core["columns"].items():
            lines.append(f"{label:22s} {c['ours_s']:8.3f} {c['raw_s']:8.3f} {c['ratio']:9.1f} "
                         f"{_us(c['ours_s'], core['rows']):12.2f} "
                         f"{c['max_abs_diff']:9.2g} {c['unit']}")
        sc = core["single_cell"]
        by = ", ".join(f"{k} {v:.0f}" for k, v in sc["cold_us_per_cell_by_function"].items())
        lines.append(f"core single-cell evaluate (this Python), {sc['cells']} cells: cold "
                     f"{_us(sc['cold_s'], sc['cells']):.1f} us/cell ({by}), warm "
                     f"{_us(sc['warm_s'], sc['cells']):.2f} us/cell")
    ratios = result.get("ratios")
    if ratios:
        lines.append("")
        lines.append("ratios (of seconds for the same cells):")
        for k, v in ratios.items():
            lines.append(f"  {k:52s} {v:8.2f}")
    return "\n".join(lines)


def ratios(result):
    out = {}
    off = result.get("office_part")
    if off:
        c = off["cases"]
        for phase in ("cold", "warm"):
            pc = c["per_cell"][f"{phase}_s"]
            out[f"per-cell / floor SKY.VERSION ({phase})"] = pc / c["floor_version"][f"{phase}_s"]
            out[f"per-cell / floor SKY.WRAP.360 ({phase})"] = pc / c["floor_wrap"][f"{phase}_s"]
            out[f"column / per-cell ({phase})"] = c["column"][f"{phase}_s"] / pc
            out[f"ours per-cell / native ({phase})"] = pc / c["native"][f"{phase}_s"]
            out[f"ours column / native ({phase})"] = (
                c["column"][f"{phase}_s"] / c["native"][f"{phase}_s"]
            )
        out["per-cell cold / per-cell warm"] = c["per_cell"]["cold_s"] / c["per_cell"]["warm_s"]
    core = result.get("core_part")
    if core:
        for label, col in core["columns"].items():
            out[f"core / raw pyerfa, {label}"] = col["ratio"]
    return out


def stale_in_oxt(oxt):
    """Core and adapter files whose copy in ``oxt`` differs from the repository's."""
    import zipfile

    wanted = {f"pythonpath/calcfuncs/{f}": os.path.join(ROOT, "calcfuncs", f)
              for f in os.listdir(os.path.join(ROOT, "calcfuncs")) if f.endswith(".py")}
    wanted["eclipsheet_addin.py"] = os.path.join(ROOT, "extension", "eclipsheet_addin.py")
    with zipfile.ZipFile(oxt) as z:
        packed = set(z.namelist())
        stale = []
        for inside, path in sorted(wanted.items()):
            with open(path, "rb") as f:
                if inside not in packed or z.read(inside) != f.read():
                    stale.append(os.path.basename(path))
    return stale


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
    parser.add_argument("--json", metavar="FILE", help="also write the numbers to FILE")
    args = parser.parse_args(argv)

    def report(msg):
        print(msg, file=sys.stderr, flush=True)

    result = {
        "python": platform.python_version(),
        "numpy": np.__version__,
        "pyerfa": erfa.__version__,
        "machine": f"{platform.machine()}, {os.cpu_count()} CPUs",
    }
    started = time.perf_counter()
    if not args.no_office:
        if not os.path.exists(args.oxt):
            parser.error(f"{args.oxt} not found; build it with: make oxt")
        stale = stale_in_oxt(args.oxt)
        if stale:
            report(f"warning: {args.oxt} differs from the sources ({', '.join(stale)}); "
                   "rebuild it with make oxt")
        result["oxt_differs_from_sources"] = stale
        result["office_part"] = office_part(args.oxt, args.rows, args.repeats, report)
    result["core_part"] = core_part(args.core_rows, args.rows, args.repeats, report)
    result["ratios"] = ratios(result)
    result["total_s"] = time.perf_counter() - started
    print(table(result))
    print(f"\ntotal {result['total_s']:.0f} s", flush=True)
    if args.json:
        save_figures(args.json, result)
    return 0


if __name__ == "__main__":
    sys.exit(main())
