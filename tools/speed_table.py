"""The README's speed tables, made from the figures the benchmarks write.

    python3 tools/speed_table.py [--figures DIR] [--readme README.md]

reads ``DIR/bench-libraries.json`` (bench/bench_libraries.py) and, where present,
``DIR/bench-sheets.json`` (bench/bench_sheets.py), and prints the tables in Markdown; with
``--readme`` it writes them into that file between the lines ``<!-- speed tables -->`` and
``<!-- end of speed tables -->`` instead.  ``make bench`` writes the figures to ``out/``;
``make speed-tables`` copies them to ``bench/figures/`` (the figures the README quotes,
kept with the code) and rewrites the README from them.  tests/test_speed_tables.py
checks that the README says what those figures say.
"""

import argparse
import json
import os
import sys

BEGIN = "<!-- speed tables -->"
END = "<!-- end of speed tables -->"


def _us(value):
    """Microseconds as the tables print them: three significant figures, ms from 1000."""
    if value >= 1000.0:
        return f"{value / 1000.0:.3g} ms"
    return f"{value:.3g} us"


def _difference(figure):
    value, unit = figure["largest_difference"], figure["difference_unit"].strip()
    return f"{value:.2g} {unit}".replace(" \"", "\"")


def library_table(figures):
    """One row a workload: ours (built in, DE440), skyfield + DE440, the others, how many
    times ours the fastest of the others takes, and the largest difference of ours from
    the reference (skyfield where it does the work, else the first other)."""
    rows, order = {}, []
    for fig in figures:
        if fig["workload"] not in rows:
            order.append(fig["workload"])
            rows[fig["workload"]] = []
        rows[fig["workload"]].append(fig)
    lines = ["| work | per | ours, built in | ours, DE440 | skyfield + DE440 | others "
             "| fastest other / ours | largest difference from the reference |",
             "|---|---|---|---|---|---|---|---|"]
    for key in order:
        figs = rows[key]
        ours = [f for f in figs if f["who"].startswith("ours")]
        others = [f for f in figs if not f["who"].startswith("ours")]
        built_in = [f for f in ours if "DE440" not in f["who"]]
        # Two rows of ours built in (two functions doing the work): the faster stands
        # for ours, and the cell names both.
        builtin = min(built_in, key=lambda f: f["us_per_unit"]) if built_in else None
        de440 = next((f for f in ours if "DE440" in f["who"]), None)
        sky = next((f for f in others if f["who"].startswith("skyfield")), None)
        rest = [f for f in others if f is not sky]
        # Like with like: with DE440 where both have it (the same precision), else built in.
        fastest_ours = (de440 or builtin or ours[0])["us_per_unit"]
        fastest_other = min(f["us_per_unit"] for f in others)
        differences = "; ".join(f"{_difference(f)} ({f['who'].split(',')[-1].strip()})"
                                for f in ours)
        cells = [
            figs[0]["title"], figs[0]["unit"],
            ("; ".join(f"{f['who'].split(',')[-1].strip()} {_us(f['us_per_unit'])}"
                       for f in built_in) if len(built_in) > 1
             else _us(builtin["us_per_unit"]) if builtin else ""),
            _us(de440["us_per_unit"]) if de440 else "",
            _us(sky["us_per_unit"]) if sky else "",
            "; ".join(f"{f['who']} {_us(f['us_per_unit'])}" for f in rest),
            f"{fastest_other / fastest_ours:.2f}",
            differences,
        ]
        lines.append("| " + " | ".join(cells) + " |")
    return "\n".join(lines)


def sheets_table(result):
    """Per cell in the real Calc, cold and warm, and as a multiple of the bridge floor;
    then the sample sheets' opening and the meteor sheet's new site."""
    lines = [f"| function, {result['rows']} cells filled down | cold | warm | cold / floor |",
             "|---|---|---|---|"]
    for name, fig in result["functions"].items():
        lines.append(f"| `{name}` ({fig['cells']} cells) | {_us(fig['cold_us_per_cell'])} "
                     f"| {_us(fig['warm_us_per_cell'])} | {fig['cold_x_floor']:.1f} |")
    out = "\n".join(lines)
    sheets = result.get("sheets") or {}
    if sheets:
        rows = ["| sample sheet | open | every cell read | hard recalculation |",
                "|---|---|---|---|"]
        for name, fig in sheets.items():
            rows.append(f"| `{name}` | {fig['open_s']:.2f} s | {fig['read_s']:.2f} s "
                        f"| {fig['hard_recalculation_s']:.2f} s |")
        out += "\n\n" + "\n".join(rows)
    edit = result.get("edit") or {}
    if edit:
        seconds = ", ".join(f"{v:.2f} s" for v in edit.get("edit_s", []))
        out += (f"\n\nA new latitude typed into `meteor_watch.ods` until every cell is read "
                f"back: {seconds}.")
    return out


def tables(directory):
    with open(os.path.join(directory, "bench-libraries.json"), encoding="utf-8") as f:
        text = library_table(json.load(f))
    sheets = os.path.join(directory, "bench-sheets.json")
    if os.path.exists(sheets):
        with open(sheets, encoding="utf-8") as f:
            text += "\n\n" + sheets_table(json.load(f))
    return text


def with_tables(readme_text, text):
    """The README with the text between the markers replaced."""
    start, end = readme_text.index(BEGIN) + len(BEGIN), readme_text.index(END)
    return readme_text[:start] + "\n" + text + "\n" + readme_text[end:]


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--figures", default="out")
    parser.add_argument("--readme")
    args = parser.parse_args(argv)
    text = tables(args.figures)
    if not args.readme:
        print(text)
        return 0
    with open(args.readme, encoding="utf-8") as f:
        old = f.read()
    new = with_tables(old, text)
    if new != old:
        with open(args.readme, "w", encoding="utf-8") as f:
            f.write(new)
    return 0


if __name__ == "__main__":
    sys.exit(main())
