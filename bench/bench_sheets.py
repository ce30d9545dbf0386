"""What a user of the real Calc waits for: each function's cost per cell filled down, the
sample sheets' opening, and a new site typed into the meteor sheet.

A benchmark, not a test: it prints numbers and asserts nothing about speed.

    .venv/bin/python bench/bench_sheets.py --oxt dist/eclipsheet.oxt [--rows 2000]
                                           [--json out.json] [--only SEASON ...]

1 functions  one formula per row, filled down ``--rows`` rows of distinct inputs in a
             fresh document with automatic calculation off; the first ``calculateAll()``
             timed (cold: nothing kept yet for these inputs, which no other run shares),
             then a second (warm); ``--repeat`` runs a case (5), the fastest kept.
             Beside them the bridge floor (=SKY.VERSION(), a cached text) and a native
             formula (=MOD(A;360)).  Event functions filled down a column of days (or
             years) for the rise and set, as a sheet of nights has them.
2 sheets     each sample sheet opened (in an office whose add-in is already loaded, as
             after a first formula), then ``calculateAll()``
3 edit       a new latitude typed into the site cell of ``meteor_watch.ods`` until every
             cell of the workbook is computed again and read back (a hidden document
             computes lazily: reading is what makes it compute, as drawing would)

Inputs are invented: the patrol-camera log of bench_recalc.py (2024-2026, and for
later runs the same log moved by whole spans of three years, log_window), consecutive
days of 2025 at an invented hill station (47.3814 N, 8.0542 E), years 1000 to 2999.
"""

import argparse
import os
import sys
import time

import numpy as np

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)
sys.path.insert(0, os.path.join(ROOT, "tools"))
sys.path.insert(0, os.path.join(ROOT, "bench"))

from bench_recalc import LOG_END, LOG_START, log_times  # noqa: E402
from timing import save_figures  # noqa: E402

SITE = "47.3814;8.0542"
FIRST_DAY = 45658.0  # 2025-01-01 as a Calc date value (null date 1899-12-30)

# The invented asteroid "Kettle A" of sample_sheets/minor_planets.ods, as an MPC line.
ORBIT_LINE = ("K26S01A 12.40  0.15 K2731 210.00000  112.40000  203.70000    6.30000  "
              "0.1280000  0.23347711   2.6120000")

# name -> (kind of input in column A, formula of row r). Kinds: log (distinct date-times),
# nights (distinct date-times, NIGHT_ROWS a night), days (consecutive dates), years
# (consecutive years).
CASES = {
    "floor: SKY.VERSION()": ("log", "=SKY.VERSION()"),
    "native: MOD(A;360)": ("log", "=MOD(A{r};360)"),
    "SKY.WRAP.360": ("log", "=SKY.WRAP.360(A{r})"),
    "SKY.JD": ("log", '=SKY.JD(A{r};"UTC";"TT")'),
    "SKY.OBLIQUITY.TRUE": ("log", "=SKY.OBLIQUITY.TRUE(A{r})"),
    "SKY.SUN.LON": ("log", "=SKY.SUN.LON(A{r})"),
    "SKY.MOON.LON": ("log", "=SKY.MOON.LON(A{r})"),
    "SKY.PLANET.RA": ("log", '=SKY.PLANET.RA("MARS";A{r})'),
    # The same Sun as an observing log has it: nights of NIGHT_ROWS rows (nodes.py).
    "SKY.SUN.LON, nights of 20 rows": ("nights", "=SKY.SUN.LON(A{r})"),
    "SKY.SUN.RISE": ("days", f"=SKY.SUN.RISE(A{{r}};{SITE})"),
    "SKY.SUN.TRANSIT": ("days", f"=SKY.SUN.TRANSIT(A{{r}};{SITE})"),
    "SKY.SUN.REACHES": ("log", "=SKY.SUN.REACHES(140;A{r})"),
    "SKY.MOON.PHASE.NEXT": ("log", '=SKY.MOON.PHASE.NEXT(A{r};;"FULL")'),
    "SKY.PLANET.EVENT.NEXT": ("log", '=SKY.PLANET.EVENT.NEXT("MARS";A{r};;"OPPOSITION")'),
    "SKY.SEASON": ("years", '=SKY.SEASON(A{r};"{event}";"TT")'),
    # A minor planet's place from its MPC line (an invented asteroid of the sample sheets).
    "SKY.ORBIT.RA (a minor planet's line)": ("log", f'=SKY.ORBIT.RA("{ORBIT_LINE}";A{{r}})'),
    # A log's row of places: four columns at one instant (Calc computes column by column).
    "a row of places (four columns)": ("log", ("=SKY.SUN.LON(A{r})", "=SKY.SUN.DEC(A{r})",
                                               "=SKY.MOON.LON(A{r})", "=SKY.MOON.RA(A{r})")),
    # A site's log: a target a row (its RA spread over the sky by a native formula, Dec
    # 20), its altitude and azimuth at the row's instant (two columns).
    "altitude and azimuth at a site (two columns)": (
        "log", tuple(f"=SKY.HORIZON.{c}(MOD(A{{r}}*7919;360);20;A{{r}};{SITE})"
                     for c in ("ALT", "AZ"))),
}


# What the core keeps (answers, event windows, the Sun's days, one instant's nutation)
# lives as long as the office: every run of every case gets inputs of its own, so that
# "cold" is cold (``shift``: the run's number among all runs of all cases).  A log's
# instants also lie in years of their own: the core notes the segments of 16 days that
# cells ask for and keeps the series' coefficients over them (calcfuncs/nodes.py, the
# last 4,000), and a second run over the same years would find them made.  The run's
# three years step back from 2024-2026 to 1972-1974 (UTC of whole leap seconds, as
# today), then forward from 2027-2029 to 2264-2266: 98 spans, more than the runs of a
# full benchmark (18 cases, five runs each), so no span is used twice in one office.
SEASON_EVENTS = ("JUNE", "SEPTEMBER", "DECEMBER", "MARCH")
_BACK_SPANS = 18     # 2024-2026 back to 1972-1974
LOG_WINDOWS = _BACK_SPANS + 80  # then 2027-2029 on to 2264-2266


def log_window(shift):
    """The date-time values (first, last) of the run ``shift``'s log."""
    k = shift % LOG_WINDOWS
    spans = -k if k < _BACK_SPANS else k - _BACK_SPANS + 1
    step = (LOG_END - LOG_START) * spans
    return LOG_START + step, LOG_END + step


NIGHT_ROWS = 20


def night_times(n, seed, start=LOG_START, end=LOG_END):
    """``n`` distinct UTC date-time values, NIGHT_ROWS on each of n / NIGHT_ROWS nights
    of 2024-2026 (or ``start`` to ``end``; distinct dates drawn at random), between 20h
    and 4h UTC, to the millisecond: a log as an observer keeps it, a row every twenty
    minutes or so."""
    rng = np.random.default_rng(seed)
    nights = -(-n // NIGHT_ROWS)
    dates = start + np.sort(rng.choice(int(end - start) - 1, nights, replace=False))
    within = np.sort(rng.uniform(20 / 24, 28 / 24, (nights, NIGHT_ROWS)), axis=1)
    t = (dates[:, None] + within).ravel()[:n]
    return np.round(t * 86400_000.0) / 86400_000.0


def inputs(kind, n, shift=0):
    if kind == "log":
        return [float(v) for v in log_times(n, 2024 + shift, *log_window(shift))]
    if kind == "nights":
        return [float(v) for v in night_times(n, 2024 + shift, *log_window(shift))]
    if kind == "days":
        return [FIRST_DAY + 366.0 * shift + k for k in range(n)]
    # Years 1000-2999 for every run; SKY.SEASON asks for another event each run.
    return [float(1000 + (k % 2000)) for k in range(n)]


def function_case(office, kind, formula, n, shift=0):
    from com.sun.star.sheet.FillDirection import TO_BOTTOM

    doc = office.new_sheet()
    try:
        sheet = doc.Sheets.getByIndex(0)
        doc.enableAutomaticCalculation(False)
        sheet.getCellRangeByName(f"A2:A{n + 1}").setDataArray(
            tuple((v,) for v in inputs(kind, n, shift)))
        formulas = (formula,) if isinstance(formula, str) else formula
        last = chr(ord("A") + len(formulas))
        for k, f in enumerate(formulas):
            event = SEASON_EVENTS[shift % len(SEASON_EVENTS)]
            sheet.getCellByPosition(1 + k, 1).setFormula(f.format(r=2, event=event))
        target = sheet.getCellRangeByName(f"B2:{last}{n + 1}")
        target.fillAuto(TO_BOTTOM, 1)
        t0 = time.perf_counter()
        doc.calculateAll()
        cold = time.perf_counter() - t0
        t0 = time.perf_counter()
        doc.calculateAll()
        warm = time.perf_counter() - t0
        values = [v for row in target.getDataArray() for v in row]
        problems = [v for v in values if isinstance(v, str) and v.startswith("#SKY")]
        return {"cold_s": cold, "warm_s": warm, "cells": n * len(formulas),
                "messages": len(problems), "example_message": problems[0] if problems else None}
    finally:
        doc.close(True)


def used_ranges(doc):
    out = []
    for i in range(doc.Sheets.getCount()):
        sh = doc.Sheets.getByIndex(i)
        cur = sh.createCursor()
        cur.gotoEndOfUsedArea(False)
        out.append(sh.getCellRangeByPosition(0, 0, cur.RangeAddress.EndColumn,
                                             cur.RangeAddress.EndRow))
    return out


def sheets_part(office, folder, report):
    out = {}
    for name in sorted(os.listdir(folder)):
        if not name.endswith(".ods"):
            continue
        t0 = time.perf_counter()
        doc = office.open(os.path.join(folder, name))
        opened = time.perf_counter() - t0
        try:
            t0 = time.perf_counter()
            for r in used_ranges(doc):
                r.getDataArray()
            read = time.perf_counter() - t0
            t0 = time.perf_counter()
            doc.calculateAll()
            hard = time.perf_counter() - t0
        finally:
            doc.close(True)
        out[name] = {"open_s": opened, "read_s": read, "hard_recalculation_s": hard}
        report(f"  {name:24s} open {opened:6.2f} s, every cell read {read:5.2f} s, "
               f"hard recalculation {hard:6.2f} s")
    return out


def edit_part(office, folder, report):
    doc = office.open(os.path.join(folder, "meteor_watch.ods"))
    try:
        lat = doc.NamedRanges.getByName("SiteLat").getReferredCells().getCellByPosition(0, 0)
        ranges = used_ranges(doc)
        for r in ranges:
            r.getDataArray()
        out = []
        for value in (lat.getValue() + 0.25, lat.getValue() - 0.5):
            t0 = time.perf_counter()
            lat.setValue(value)
            for r in ranges:
                r.getDataArray()
            out.append(time.perf_counter() - t0)
            report(f"  latitude {value:.4f}: {out[-1]:.2f} s until every cell is read back")
        return {"edit_s": out}
    finally:
        doc.close(True)


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--oxt", default=os.path.join(ROOT, "dist", "eclipsheet.oxt"))
    parser.add_argument("--rows", type=int, default=2000)
    parser.add_argument("--sheets", default=os.path.join(ROOT, "sample_sheets"))
    parser.add_argument("--json", metavar="FILE")
    parser.add_argument("--repeat", type=int, default=5,
                        help="fresh documents per case; the fastest cold and warm are kept "
                             "(one run's times swing by tens of percent on a shared machine)")
    parser.add_argument("--only", metavar="TEXT", action="append",
                        help="only the cases whose name holds TEXT (repeatable; the floor "
                             "is always run): no sheets, no edit, no --json figures")
    opts = parser.parse_args(argv)
    from officekit import Office

    def report(msg):
        print(msg, flush=True)

    result = {"rows": opts.rows}
    with Office(oxt=opts.oxt) as office:
        # The first add-in call imports numpy, ERFA and the core: done before timing.
        warm_up = office.new_sheet()
        warm_up.Sheets.getByIndex(0).getCellByPosition(0, 0).setFormula("=SKY.JD(40000)")
        warm_up.calculateAll()
        warm_up.close(True)
        report(f"functions, {opts.rows} cells each (per cell: cold, warm; x bridge floor)")
        cases = {}
        for number, (name, (kind, formula)) in enumerate(CASES.items()):
            if opts.only and not name.startswith("floor") and not any(
                    text in name for text in opts.only):
                continue
            n = min(opts.rows, 365) if kind == "days" else opts.rows
            # (SKY.SEASON's runs differ by their event: at most one run for each.)
            repeat = min(opts.repeat, len(SEASON_EVENTS)) if kind == "years" else opts.repeat
            runs = [function_case(office, kind, formula, n, number * opts.repeat + j)
                    for j in range(repeat)]
            res = min(runs, key=lambda r: r["cold_s"])
            res["warm_s"] = min(r["warm_s"] for r in runs)
            res["repeats"] = repeat
            cases[name] = res
        floor = cases["floor: SKY.VERSION()"]["cold_s"] / cases["floor: SKY.VERSION()"]["cells"]
        for name, res in cases.items():
            per = res["cold_s"] / res["cells"]
            res["cold_us_per_cell"] = per * 1e6
            res["warm_us_per_cell"] = res["warm_s"] / res["cells"] * 1e6
            res["cold_x_floor"] = per / floor
            report(f"  {name:24s} {res['cells']:5d} cells  cold {per * 1e6:8.1f} us "
                   f"warm {res['warm_us_per_cell']:6.1f} us  x{per / floor:6.1f} of the floor"
                   + (f"  ({res['messages']} messages: {res['example_message']})"
                      if res["messages"] else ""))
        result["functions"] = cases
        if opts.only:
            return
        report("sample sheets")
        result["sheets"] = sheets_part(office, opts.sheets, report)
        report("meteor_watch.ods, a new site latitude")
        result["edit"] = edit_part(office, opts.sheets, report)
    if opts.json:
        save_figures(opts.json, result)


if __name__ == "__main__":
    main()
