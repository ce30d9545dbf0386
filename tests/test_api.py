"""The Python API (calcfuncs.api) and the command line (python -m calcfuncs) mirror the cells.

The reference here is the cell layer itself (calcfuncs.cells.evaluate): the API and the
CLI must give the value and the message a cell gives for the same input.  Whether those
values are right is checked against outside sources in the other test files; the
office test at the end compares with the cells of a real Calc on the sample sheets.
"""

import csv
import datetime
import inspect
import os
import subprocess
import sys

import numpy as np
import pytest

from calcfuncs import api, cli, registry
from calcfuncs.cells import evaluate
from calcfuncs.errors import PREFIX

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))


# ---- names and arguments --------------------------------------------------------------


def test_every_registry_function_is_reachable_by_the_documented_name_rule():
    assert list(api.FUNCTIONS) == [
        f.name[4:].lower().replace(".", "_") for f in registry.FUNCTIONS]
    for fn in registry.FUNCTIONS:
        py = getattr(api, api.python_name(fn.name))
        assert py.cell_function is fn
        assert api.lookup(fn.name) is py and api.lookup(fn.name.lower()) is py
        assert py.__name__ in api.__all__


@pytest.mark.parametrize("display, name", [
    ("SKY.SUN.LON", "sun_lon"), ("SKY.JD", "jd"), ("SKY.WRAP.360", "wrap_360"),
    ("SKY.BJD.TDB.DATETIME", "bjd_tdb_datetime"), ("SKY.TEXT.DMS", "text_dms"),
])
def test_name_rule_examples_from_the_readme(display, name):
    assert api.python_name(display) == name


def test_argument_names_order_and_defaults_match_the_registry():
    for fn in registry.FUNCTIONS:
        params = list(inspect.signature(api.FUNCTIONS[api.python_name(fn.name)]).parameters.values())
        cell_params = [p for p in params if p.kind is p.POSITIONAL_OR_KEYWORD]
        assert [p.name for p in cell_params] == [a.name for a in fn.args], fn.name
        for p, a in zip(cell_params, fn.args):
            if a.optional:
                assert p.default == a.default, (fn.name, a.name)
            else:
                assert p.default is inspect.Parameter.empty, (fn.name, a.name)
        assert [p.name for p in params if p.kind is p.KEYWORD_ONLY] == ["null_date", "on_error"]


def test_the_docstring_carries_the_registry_texts():
    fn = registry.BY_NAME["SKY.OBLIQUITY"]
    doc = " ".join(api.obliquity.__doc__.split())
    assert " ".join(fn.summary.split()) in doc
    for a in fn.args:
        assert " ".join(a.description.split()) in doc


def test_an_unknown_keyword_is_a_python_error_not_a_cell_message():
    with pytest.raises(TypeError):
        api.jd("2024-01-01", sclae="TT")
    with pytest.raises(ValueError, match="unknown function"):
        api.call("SKY.NO.SUCH")


def test_calcfuncs_call_is_the_api_call():
    import calcfuncs

    args = ("2024-03-20T03:06:00Z", "UTC", "TT")
    want = evaluate("SKY.JD", args)
    assert calcfuncs.call("SKY.JD", *args) == api.call("jd", *args) == want
    assert calcfuncs.call("jd", "2024-03-20T03:06:00Z", result_scale="TT") == want
    rows = ((45371.5,), (45372.5,))  # a range: rows in, a list of rows out
    assert calcfuncs.call("SKY.JD", rows) == [list(r) for r in evaluate("SKY.JD", (rows,))]
    bad = ("2024-01-01", None, "IAU2007")
    with pytest.raises(api.SkyError) as caught:
        calcfuncs.call("SKY.OBLIQUITY", *bad)
    assert PREFIX + str(caught.value) == evaluate("SKY.OBLIQUITY", bad)
    assert calcfuncs.call("SKY.OBLIQUITY", *bad, on_error="text") == evaluate("SKY.OBLIQUITY", bad)
    with pytest.raises(ValueError, match="unknown function"):
        calcfuncs.call("SKY.NO.SUCH")


def test_returns_datetime_follows_the_result_kind():
    assert [f.name for f in registry.FUNCTIONS if api.returns_datetime(f)] == [
        f.name for f in registry.FUNCTIONS if f.result_kind == "datetime"]
    assert api.returns_datetime(registry.BY_NAME["SKY.SEASON"])
    assert not api.returns_datetime(registry.BY_NAME["SKY.JD"])


# ---- values and messages identical to the cells -----------------------------------------

# (function, cell arguments as Calc hands them over, same as keywords for the API)
GOOD = [
    ("SKY.JD", ("2024-03-20T03:06:00Z", "UTC", "TT"), {}),
    ("SKY.MJD", ("2016-12-31T23:59:60.5Z", "UTC", "TAI"), {}),
    ("SKY.DATETIME", (45371.5, "UTC", "TDB"), {}),
    ("SKY.TEXT.ISO", ("JD 2451545.0", "TT", "UTC", None, 6), {}),
    ("SKY.DELTAT", ("1066 October 14", "UT"), {}),
    ("SKY.OBLIQUITY", ("JD 1000000.5", "TT", "VONDRAK2011"), {}),
    ("SKY.NUTATION.LON", (45371.5, None, None, "ARCSEC"), {}),
    ("SKY.ANGLE.HOURS", ("12 34 56.7",), {}),
    ("SKY.TEXT.DMS", (-23.4392911, 2.0), {}),
    ("SKY.COORD.LON", (187.5, -0.5, "ICRS", "ECLIPTIC DATE", 46346.0), {}),
    ("SKY.HORIZON.ALT", (83.63, 22.01, 46346.0, 52.6, 1.3, None, 25.0, 1010.0, 8.0), {}),
    ("SKY.SEASON", (2027.0, "JUNE"), {}),
    ("SKY.SUN.SET", (46388.0, 52.6, 1.3, None, 1.0, "ASTRONOMICAL"), {}),
    ("SKY.MOON.PHASE.NEXT", (46387.0, None, "FULL"), {}),
    ("SKY.BJD.TDB", (46400.9, 135.67, 63.12, None, "MJD"), {}),
    ("SKY.VERSION", (), {}),
]


@pytest.mark.parametrize("name, cell_args, _", GOOD, ids=[g[0] for g in GOOD])
def test_api_value_is_the_cells_value(name, cell_args, _):
    want = evaluate(name, cell_args)
    assert not (isinstance(want, str) and want.startswith(PREFIX)), want
    got = api.call(name, *cell_args)
    assert got == want and type(got) is type(want)


def test_keywords_give_the_same_value_as_positions():
    assert api.horizon_alt(83.63, 22.01, 46346.0, 52.6, 1.3, height=25.0, pressure=1010.0,
                           temperature=8.0) == evaluate(
        "SKY.HORIZON.ALT", (83.63, 22.01, 46346.0, 52.6, 1.3, None, 25.0, 1010.0, 8.0))


BAD = [
    ("SKY.JD", ("2025-13-01",)),
    ("SKY.JD", (2460000.0,)),
    ("SKY.JD", ("2015-06-29T23:59:60",)),
    ("SKY.OBLIQUITY", ("2024-01-01", None, "IAU2007")),
    ("SKY.OBLIQUITY", ("JD 1000000", "TT")),
    ("SKY.ANGLE", ("12h30d",)),
    ("SKY.TEXT.DMS", (23.5, 12.0)),
    ("SKY.COORD.LON", (10.0, 20.0, "ICRS", "ECLIPTIC DATE")),
    ("SKY.COORD.LAT", (10.0, 20.0, "ICRS", "NOWHERE")),
    ("SKY.AIRMASS", (-5.0,)),
    ("SKY.SEASON", (1200.5,)),
    ("SKY.SUN.RISE", ("2026-06-21", 78.2, 15.6)),
]


@pytest.mark.parametrize("name, cell_args", BAD, ids=[f"{b[0]}-{i}" for i, b in enumerate(BAD)])
def test_api_raises_the_cells_message(name, cell_args):
    shown = evaluate(name, cell_args)
    if name == "SKY.SUN.RISE":  # polar day is said in words, not as a #SKY: message
        assert api.call(name, *cell_args) == shown and not shown.startswith(PREFIX)
        return
    assert isinstance(shown, str) and shown.startswith(PREFIX), shown
    with pytest.raises(ValueError) as caught:
        api.call(name, *cell_args)
    assert PREFIX + str(caught.value) == shown
    assert isinstance(caught.value, api.SkyError)
    assert api.call(name, *cell_args, on_error="text") == shown


def test_every_function_answers_nonsense_input_with_the_cells_message():
    """Generic over the registry: every argument given as text that means nothing."""
    for fn in registry.FUNCTIONS:
        if not fn.args:
            continue
        cell_args = tuple("zz nonsense" for _ in fn.args)
        shown = evaluate(fn.name, cell_args)
        assert isinstance(shown, str) and shown.startswith(PREFIX), (fn.name, shown)
        with pytest.raises(ValueError) as caught:
            api.call(fn.name, *cell_args)
        assert PREFIX + str(caught.value) == shown, fn.name


def test_a_list_is_a_column_computed_as_the_whole_column_form():
    times = ["2024-03-20T03:06:00Z", "2025-13-01", "JD 2460000.5", None]
    column = tuple((t,) for t in times)
    want = [row[0] for row in evaluate("SKY.JD", (column, "UTC", "TT"))]
    assert api.jd(times, "UTC", "TT", on_error="text") == want
    assert want[1].startswith(PREFIX) and want[3] == ""  # a bad row and an empty row
    with pytest.raises(ValueError) as caught:
        api.jd(times, "UTC", "TT")
    assert PREFIX + str(caught.value) == want[1]
    assert caught.value.row == 1 and caught.value.results == want


def test_numpy_arrays_and_rows_of_values():
    ra = np.array([10.0, 20.0, 30.0])
    want = [row[0] for row in evaluate("SKY.WRAP.180", (((190.0,), (200.0,), (210.0,)),))]
    assert api.wrap_180(ra + 180.0) == want
    rows = [[190.0, 200.0], [210.0, -190.0]]
    assert api.wrap_180(rows) == [list(r) for r in evaluate("SKY.WRAP.180", (tuple(map(tuple, rows)),))]
    assert api.wrap_360(np.float64(-10.0)) == 350.0


def test_python_dates_are_read_as_iso_text():
    moment = datetime.datetime(2024, 3, 20, 3, 6, 0, 250000)
    assert api.jd(moment, result_scale="TT") == evaluate(
        "SKY.JD", ("2024-03-20T03:06:00.250000", "UTC", "TT"))
    assert api.leapseconds(datetime.date(2017, 1, 1)) == evaluate("SKY.LEAPSECONDS", ("2017-01-01",))
    aware = datetime.datetime(2024, 3, 20, 3, 6, tzinfo=datetime.timezone.utc)
    assert api.jd(aware) == api.jd("2024-03-20T03:06:00Z")


def test_datetime_from_serial():
    # 2024-03-20 03:06:00 as a date-time value (days since 1899-12-30): 45371 + 3.1/24.
    assert api.datetime_from_serial(45371 + 3.1 / 24) == datetime.datetime(2024, 3, 20, 3, 6)
    assert api.datetime_from_serial(0.0, null_date=(1904, 1, 1)) == datetime.datetime(1904, 1, 1)


def test_null_date_is_honoured_as_in_a_1904_document():
    serial_1904 = 45371.5 - 1462  # the same day counted from 1904-01-01
    assert api.jd(serial_1904, null_date=(1904, 1, 1)) == api.jd(45371.5)


# ---- the command line -------------------------------------------------------------------


def _write_csv(path, rows):
    with open(path, "w", encoding="utf-8", newline="") as f:
        csv.writer(f, lineterminator="\n").writerows(rows)


def _read_csv(path):
    with open(path, encoding="utf-8", newline="") as f:
        return list(csv.reader(f))


LOG = [
    ["timestamp", "observer", "ra", "dec"],
    ["2024-03-20T03:06:00Z", "AB", "12:30:00", "-0.5"],
    ["2025-13-01", "CK", "05h47m55.1s", "-07 18 02.4"],  # a month that does not exist
    ["JD 2460000.5", "DM", "xx", "+41:12:33.8"],          # a bad RA text
    ["", "RT", "", ""],                                    # an empty row stays empty
    ["2026-11-20 00:00:00", "AB", "09 02 41.7", "63.1208"],
]


def test_cli_round_trip_with_a_bad_row(tmp_path, capsys):
    src, out = tmp_path / "log.csv", tmp_path / "result.csv"
    _write_csv(src, LOG)
    before = src.read_bytes()
    status = cli.main(["SKY.JD", "--in", str(src), "--arg", "time=timestamp",
                       "--set", "result_scale=TT", "--out", str(out), "--column", "jd_tt"])
    err = capsys.readouterr().err
    assert status == 1  # a row holds a message
    assert src.read_bytes() == before
    rows = _read_csv(out)
    assert rows[0] == LOG[0] + ["jd_tt"]
    assert [r[:4] for r in rows[1:]] == LOG[1:]
    times = [r[0] or None for r in LOG[1:]]
    want = api.jd(times, result_scale="TT", on_error="text")
    for row, w in zip(rows[1:], want):
        assert row[4] == (repr(w) if isinstance(w, float) else w)
    assert rows[2][4].startswith(PREFIX) and rows[4][4] == ""
    assert "5 rows, 3 computed, 1 left blank" in err and "1 with a #SKY: message" in err
    assert "line 3: " + rows[2][4] in err


def test_cli_two_columns_per_row_options_and_an_angle_message(tmp_path, capsys):
    src, out = tmp_path / "log.csv", tmp_path / "out.csv"
    _write_csv(src, LOG)
    status = cli.main(["SKY.COORD.LON", "--in", str(src), "--arg", "lon=ra", "--arg", "lat=dec",
                       "--set", "from_system=EQ J2000", "--set", "to_system=GALACTIC",
                       "--out", str(out)])
    capsys.readouterr()
    rows = _read_csv(out)
    assert status == 1 and rows[0][-1] == "coord_lon"
    # What cells holding the same fields would hand over: a field that reads as a
    # number is a number, other text stays text ("12:30:00" is then degrees, as a cell
    # reads it: hours need SKY.ANGLE.HOURS first), an empty field is an empty cell.
    ra = ["12:30:00", "05h47m55.1s", "xx", None, "09 02 41.7"]
    dec = [-0.5, "-07 18 02.4", "+41:12:33.8", None, 63.1208]
    want = api.coord_lon(ra, dec, "EQ J2000", "GALACTIC", on_error="text")
    assert [r[-1] for r in rows[1:]] == [repr(w) if isinstance(w, float) else w for w in want]
    assert rows[3][-1].startswith('#SKY: "xx" is not an angle')


def test_cli_date_time_results_as_iso_text_or_as_the_cells_number(tmp_path, capsys):
    src = tmp_path / "years.csv"
    _write_csv(src, [["year"], ["2024"], ["2027"]])
    assert cli.main(["SKY.SEASON", "--in", str(src), "--arg", "year=year", "--set",
                     "event=MARCH", "--out", str(tmp_path / "iso.csv")]) == 0
    assert cli.main(["SKY.SEASON", "--in", str(src), "--arg", "year=year", "--set",
                     "event=MARCH", "--out", str(tmp_path / "num.csv"), "--dates", "number"]) == 0
    capsys.readouterr()
    iso = [r[1] for r in _read_csv(tmp_path / "iso.csv")[1:]]
    num = [float(r[1]) for r in _read_csv(tmp_path / "num.csv")[1:]]
    assert num == api.season([2024.0, 2027.0])
    # The ISO text reads back as the same instant to the microsecond it keeps.
    assert api.jd(iso) == pytest.approx([api.jd(n) for n in num], abs=2e-11)
    # US Naval Observatory: March equinox 2024 at 03:06 UTC (to the minute).
    assert iso[0].startswith("2024-03-20T03:06:")


def test_cli_refuses_to_write_over_the_input_or_an_existing_file(tmp_path, capsys):
    src, out = tmp_path / "log.csv", tmp_path / "out.csv"
    _write_csv(src, LOG)
    before = src.read_bytes()
    args = ["SKY.JD", "--in", str(src), "--arg", "time=timestamp"]
    assert cli.main(args + ["--out", str(src), "--replace"]) == 2
    assert src.read_bytes() == before
    out.write_text("keep me")
    assert cli.main(args + ["--out", str(out)]) == 2
    assert out.read_text() == "keep me"
    assert cli.main(args + ["--out", str(out), "--replace"]) == 1  # replaced (a bad row)
    assert _read_csv(out)[0][-1] == "jd"
    err = capsys.readouterr().err
    assert "is the input file" in err and "exists; add --replace" in err
    assert sorted(os.listdir(tmp_path)) == ["log.csv", "out.csv"]  # no partial files


def test_cli_interrupted_run_leaves_no_partial_target(tmp_path, monkeypatch):
    src, out = tmp_path / "log.csv", tmp_path / "out.csv"
    _write_csv(src, [["t"]] + [["2024-01-01"]] * 10)
    monkeypatch.setattr(cli, "CHUNK_ROWS", 3)
    calls = []
    real = cli._compute

    def failing(*args):
        calls.append(1)
        if len(calls) == 2:
            raise KeyboardInterrupt  # the user pressed Ctrl+C in the middle
        return real(*args)

    monkeypatch.setattr(cli, "_compute", failing)
    with pytest.raises(KeyboardInterrupt):
        cli.main(["SKY.JD", "--in", str(src), "--arg", "time=t", "--out", str(out)])
    assert os.listdir(tmp_path) == ["log.csv"]


@pytest.mark.parametrize("argv, needle", [
    (["SKY.JD", "--in", "IN", "--arg", "scale=UTC", "--arg", "time=timestamp", "--out", "OUT"],
     'no column "UTC"'),
    (["SKY.JD", "--in", "IN", "--out", "OUT"], "SKY.JD needs time"),
    (["SKY.JD", "--in", "IN", "--arg", "when=timestamp", "--out", "OUT"],
     'SKY.JD has no argument "when"'),
    (["SKY.JD", "--in", "IN", "--arg", "time=timestamp", "--set", "time=x", "--out", "OUT"],
     "not both"),
    (["SKY.JD", "--in", "IN", "--arg", "time=timestamp", "--out", "OUT", "--column", "ra"],
     'already has a column "ra"'),
    (["SKY.NOPE", "--in", "IN", "--out", "OUT"], "unknown function"),
])
def test_cli_usage_problems_are_said_before_any_row(tmp_path, capsys, argv, needle):
    src = tmp_path / "log.csv"
    _write_csv(src, LOG)
    argv = [str(src) if a == "IN" else str(tmp_path / "o.csv") if a == "OUT" else a for a in argv]
    assert cli.main(argv) == 2
    assert needle in capsys.readouterr().err
    assert not (tmp_path / "o.csv").exists()


def test_cli_list_and_per_function_help_show_the_registry_texts(capsys):
    assert cli.main(["--list"]) == 0
    listing = capsys.readouterr().out
    for fn in registry.FUNCTIONS:
        assert fn.name in listing and api.python_name(fn.name) in listing
    fn = registry.BY_NAME["SKY.HORIZON.ALT"]
    assert cli.main(["SKY.HORIZON.ALT", "--help"]) == 0
    text = " ".join(capsys.readouterr().out.split())
    for piece in [fn.summary, fn.result, fn.model] + [a.description for a in fn.args]:
        assert " ".join(piece.split()) in text


def test_python_dash_m_calcfuncs_runs_from_the_shell(tmp_path):
    src, out = tmp_path / "log.csv", tmp_path / "out.csv"
    _write_csv(src, [["when", "scale"], ["2000-01-01T12:00:00", "TT"], ["J2000.0", "TT"]])
    done = subprocess.run(
        [sys.executable, "-m", "calcfuncs", "SKY.MJD", "--in", str(src), "--arg", "time=when",
         "--arg", "scale=scale", "--out", str(out)],
        capture_output=True, text=True, cwd=ROOT, timeout=120)
    assert done.returncode == 0, done.stderr
    # J2000.0 is JD 2451545.0 TT, MJD 51544.5 (IAU definition).
    assert [r[-1] for r in _read_csv(out)[1:]] == ["51544.5", "51544.5"]
    assert "2 rows, 2 computed" in done.stderr


# ---- the same as the cells of a real Calc, on the sample sheets ---------------------------

# meteor_watch.ods is left out for time: opening it recomputes about 4,000 sunrise and
# sunset cells one by one (98 s here on a loaded 2-core machine); the Sun's functions go
# through the same API path as those compared.
SAMPLE_BOOKS = ("observing_log.ods", "timing_and_moon.ods", "historical_record.ods",
                "target_list.ods")
PROGRAMMATIC = registry.IMPLEMENTATION_NAME.upper() + "."
BY_STORED_NAME = {f.method.upper(): f for f in registry.FUNCTIONS}
# Their value names the libraries (or the leap-second table's ERFA release), which
# differ between the office's Python and this venv: compared in the office's Python.
LIBRARY_DEPENDENT = {"SKY.VERSION", "SKY.LEAPSECONDS.UNTIL"}
REL = 1e-9
# The office's Python takes its own numpy (Debian 12's 1.24, whose float64 sines are
# vectorised: the nutation's, and the Earth's series there, calcfuncs/earth_theory.py)
# where this venv takes numpy 2 and ERFA's routine: a place may differ in its last bits,
# and a quantity that is nearly zero (the Moon's elongation at a new Moon, 2e-12 degree)
# by more than REL of itself.  ABS as test_office_functions.py has it.
ABS = 1e-9


class _Unsupported(Exception):
    """A formula that is more than calls, references and constants (arithmetic, IF)."""


class _Formulas:
    """Just enough of a formula reader for the sample sheets' calls of our functions:
    nested calls, cell references (with sheet), named cells, texts, numbers, left-out
    arguments.  Anything else raises _Unsupported and the cell is left out."""

    _REF = __import__("re").compile(
        r"(?:\$?(?:'(?P<q>[^']+)'|(?P<s>[A-Za-z_][\w]*))\.)?\$?(?P<col>[A-Z]{1,3})\$?(?P<row>\d+)")
    _NUM = __import__("re").compile(r"[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?")
    _NAME = __import__("re").compile(r"[A-Za-z_][\w]*")

    def __init__(self, doc):
        from com.sun.star.table.CellContentType import EMPTY

        self.doc = doc
        self.values = {}
        self.empty = EMPTY
        self.inner = set()  # functions met inside another call of ours

    def cell(self, sheet_name, col, row):
        key = sheet_name
        if key not in self.values:
            sheet = self.doc.Sheets.getByName(sheet_name)
            cursor = sheet.createCursor()
            cursor.gotoEndOfUsedArea(False)
            end = cursor.getRangeAddress()
            self.values[key] = (sheet, sheet.getCellRangeByPosition(
                0, 0, end.EndColumn, end.EndRow).getDataArray())
        sheet, data = self.values[key]
        v = data[row][col] if row < len(data) and col < len(data[row]) else ""
        if v == "" and sheet.getCellByPosition(col, row).getType() == self.empty:
            return 0.0  # Calc hands an add-in 0.0 for a reference to an empty cell
        return v

    def parse(self, text, sheet_name):
        if not text.startswith("="):
            raise _Unsupported(text)
        node, rest = self._expr(text[1:], sheet_name)
        if rest:
            raise _Unsupported(text)
        return node

    def _expr(self, s, sheet_name):
        if s.startswith(PROGRAMMATIC):
            method, _, after = s[len(PROGRAMMATIC):].partition("(")
            fn = BY_STORED_NAME.get(method)
            if fn is None or not after:
                raise _Unsupported(s)
            args, s = [], after
            if s.startswith(")"):
                return ("call", fn, args), s[1:]
            while True:
                if s[:1] in (";", ")"):
                    args.append(("const", None))  # argument left out
                else:
                    node, s = self._expr(s, sheet_name)
                    args.append(node)
                if s.startswith(";"):
                    s = s[1:]
                    continue
                if s.startswith(")"):
                    return ("call", fn, args), s[1:]
                raise _Unsupported(s)
        if s.startswith('"'):
            out, i = [], 1
            while True:
                j = s.index('"', i)
                out.append(s[i:j])
                if s[j + 1:j + 2] == '"':
                    out.append('"')
                    i = j + 2
                    continue
                return ("const", "".join(out)), s[j + 1:]
        m = self._REF.match(s)
        if m and not self._NAME.match(s[m.end():m.end() + 1] or " "):
            sheet = m.group("q") or m.group("s") or sheet_name
            col = 0
            for ch in m.group("col"):
                col = col * 26 + ord(ch) - 64
            return ("ref", sheet, col - 1, int(m.group("row")) - 1), self._after(s[m.end():])
        m = self._NUM.match(s)
        if m:
            return ("const", float(m.group())), self._after(s[m.end():])
        m = self._NAME.match(s)
        if m and self.doc.NamedRanges.hasByName(m.group()):
            content = self.doc.NamedRanges.getByName(m.group()).getContent()
            node, rest = self._expr(content, sheet_name)
            if rest:
                raise _Unsupported(content)
            return node, self._after(s[m.end():])
        raise _Unsupported(s)

    @staticmethod
    def _after(rest):
        if rest and rest[0] not in ";)":
            raise _Unsupported(rest)  # an operator follows: arithmetic
        return rest

    def value(self, node):
        """Arguments resolved to what Calc hands over; nested calls through the API."""
        kind = node[0]
        if kind == "const":
            return node[1]
        if kind == "ref":
            return self.cell(*node[1:])
        fn, args = node[1], node[2]
        self.inner.add(fn.name)
        return api.call(fn.name, *[self.value(a) for a in args], on_error="text")


def _same(got, want):
    if isinstance(want, float) and isinstance(got, float):
        return (abs(got - want) <= max(REL * max(abs(want), abs(got)), ABS)
                or got == want)
    return got == want and type(got) is type(want)


def _sample_calls(office, tmp_path):
    """Per sample book: [(fn, [argument values], value the office shows, where)]."""
    import shutil

    import officekit

    found, inner = [], set()
    for book in SAMPLE_BOOKS:
        copy = tmp_path / book  # the office may leave a lock file beside what it opens
        shutil.copyfile(os.path.join(ROOT, "sample_sheets", book), copy)
        doc = office.open(str(copy))
        try:
            doc.calculateAll()
            reader = _Formulas(doc)
            for i in range(doc.Sheets.getCount()):
                sheet = doc.Sheets.getByIndex(i)
                for col, row, formula, shown in officekit.formula_cells(sheet):
                    if PROGRAMMATIC not in formula or formula.startswith("{"):
                        continue  # not ours, or a whole-column array formula
                    try:
                        node = reader.parse(formula, sheet.Name)
                    except _Unsupported:
                        continue
                    if node[0] != "call":
                        continue
                    args = [reader.value(a) for a in node[2]]
                    found.append((node[1], args, shown, f"{book} {sheet.Name} col {col} row {row + 1}"))
            inner |= reader.inner
        finally:
            doc.close(True)
    return found, inner


@pytest.fixture(scope="module")
def sample_calls(office, tmp_path_factory):
    return _sample_calls(office, tmp_path_factory.mktemp("samples"))


def _groups(calls):
    by_fn = {}
    for fn, args, shown, where in calls[0]:
        by_fn.setdefault(fn.name, []).append((args, shown, where))
    return by_fn


@pytest.mark.office
def test_api_gives_the_cells_values_on_the_sample_sheets(sample_calls):
    by_fn = _groups(sample_calls)
    # Calls inside arithmetic or IF are left out; those inside another call of ours are
    # checked through the outer cell.
    reached = set(by_fn) | sample_calls[1]
    assert len(reached) >= 50, sorted(reached)
    worst, compared = 0.0, 0
    for name, cases in by_fn.items():
        if name in LIBRARY_DEPENDENT:
            continue
        # Per cell, as a cell computes (the first 25 of each function) ...
        for args, shown, where in cases[:25]:
            got = api.call(name, *args, on_error="text")
            assert _same(got, shown), (where, name, args, got, shown)
        # ... and all of them as columns, as a script would pass a log.
        width = max(len(a) for a, _, _ in cases)
        columns = [[a[k] if k < len(a) else None for a, _, _ in cases] for k in range(width)]
        got = api.call(name, *columns, on_error="text")
        for g, (args, shown, where) in zip(got, cases):
            assert _same(g, shown), (where, name, args, g, shown)
            if isinstance(g, float) and isinstance(shown, float) and shown:
                worst = max(worst, abs(g - shown) / abs(shown))
            compared += 1
    print(f"\nAPI vs cells: {compared} cells of {len(by_fn)} functions (and "
          f"{len(sample_calls[1] - set(by_fn))} more inside them); worst relative difference "
          f"{worst:.2e}; not reached: "
          + ", ".join(sorted({f.name for f in registry.FUNCTIONS} - reached)))
    assert compared > 3000


@pytest.mark.office
def test_library_dependent_values_match_in_the_offices_own_python(sample_calls):
    by_fn = _groups(sample_calls)
    office_python = os.path.join(sys.base_prefix, "bin", "python3")  # the venv's base
    for name in sorted(LIBRARY_DEPENDENT & set(by_fn)):
        shown = by_fn[name][0][1]
        done = subprocess.run(
            [office_python, "-c", f"from calcfuncs import api; print(repr(api.call({name!r})))"],
            capture_output=True, text=True, cwd=ROOT, timeout=120, check=True)
        assert eval(done.stdout) == shown, (name, done.stdout, shown)  # a repr we printed


@pytest.mark.office
def test_cli_gives_the_cells_values_on_the_sample_sheets(sample_calls, tmp_path, capsys):
    by_fn = _groups(sample_calls)
    compared = {}
    for name, cases in by_fn.items():
        fn = registry.BY_NAME[name]
        if name in LIBRARY_DEPENDENT or not fn.args:
            continue
        # A CSV holds text: date-time values in a time argument do not travel (the CLI
        # refuses bare numbers as times, as a cell refuses them as text).
        if any(isinstance(args[k], float) for args, _, _ in cases
               for k, a in enumerate(fn.args) if k < len(args) and a.kind == "time"):
            continue
        header = [a.name for a in fn.args]
        rows = []
        for args, _, _ in cases:
            row = []
            for k, a in enumerate(fn.args):
                v = args[k] if k < len(args) else None
                if v is None or (v == 0.0 and a.kind in ("choice", "scale")):
                    row.append("")  # left out, or an empty cell: the default either way
                else:
                    row.append(repr(v) if isinstance(v, float) else v)
            rows.append(row)
        src, out = tmp_path / f"{name}.csv", tmp_path / f"{name}-out.csv"
        _write_csv(src, [header] + rows)
        argv = [name, "--in", str(src), "--out", str(out), "--dates", "number", "--column", "result"]
        for a in fn.args:
            argv += ["--arg", f"{a.name}={a.name}"]
        status = cli.main(argv)
        capsys.readouterr()
        written = [r[-1] for r in _read_csv(out)[1:]]
        expect_messages = any(isinstance(s, str) and s.startswith(PREFIX) for _, s, _ in cases)
        assert status == (1 if expect_messages else 0), name
        for text, (args, shown, where) in zip(written, cases):
            got = float(text) if isinstance(shown, float) else text
            assert _same(got, shown), (where, name, args, text, shown)
        compared[name] = len(cases)
    print(f"\nCLI vs cells: {sum(compared.values())} cells of {len(compared)} functions: "
          + ", ".join(sorted(compared)))
    assert len(compared) >= 10
