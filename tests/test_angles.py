"""Angles: sexagesimal text to degrees, degrees back to text, and wrapping.

Expected degrees are either the plain definition of sexagesimal notation
(d + m/60 + s/3600; 1 h = 15 degrees) or catalogue positions quoted in both forms.
"""

import numpy as np
import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st

import calcfuncs
from calcfuncs.angles import dms_text, hms_text, parse_angle, wrap_180, wrap_360
from calcfuncs.cells import evaluate

OBLIQUITY_1976 = 23 + 26 / 60 + 21.448 / 3600  # 23 26' 21.448" (IAU 1976, common practice)


def sexa(d, m=0.0, s=0.0, sign=1):
    """Definition of sexagesimal notation."""
    return sign * (d + m / 60.0 + s / 3600.0)


# ---- text -> degrees: every form in the module's docstring ------------------------------------

FORMS = [
    # text, hours_by_default, degrees by definition
    ("-23°26'21.4\"", False, sexa(23, 26, 21.4, -1)),
    ("-23°26′21.4″", False, sexa(23, 26, 21.4, -1)),  # prime and double prime
    ("−23°26'21.4\"", False, sexa(23, 26, 21.4, -1)),  # minus sign U+2212
    ("-23°26'21.4''", False, sexa(23, 26, 21.4, -1)),  # two single quotes for seconds
    ("-23º26'21.4\"", False, sexa(23, 26, 21.4, -1)),  # ordinal indicator for a degree
    ("-23° 26' 21.4\"", False, sexa(23, 26, 21.4, -1)),
    ("23d26m21.4s", False, sexa(23, 26, 21.4)),
    ("23deg26'21.4\"", False, sexa(23, 26, 21.4)),
    ("-23 26 21.4", False, sexa(23, 26, 21.4, -1)),
    ("-23:26:21.4", False, sexa(23, 26, 21.4, -1)),
    ("+23 26 21.4", False, sexa(23, 26, 21.4)),
    ("-23.4393", False, -23.4393),
    ("-23.4393°", False, -23.4393),
    ("-23 26.35", False, sexa(23, 26.35, 0, -1)),
    ("  -23 26 21.4  ", False, sexa(23, 26, 21.4, -1)),
    ("-00°30'00\"", False, -0.5),  # a southern declination under one degree stays negative
    ("-0 30", False, -0.5),
    ("12h34m56.7s", False, 15 * sexa(12, 34, 56.7)),  # an h mark always means hours
    ("12h 34m 56.7s", False, 15 * sexa(12, 34, 56.7)),
    ("12.5h", False, 187.5),
    ("12:34:56.7", True, 15 * sexa(12, 34, 56.7)),  # read as right ascension
    ("12 34 56.7", True, 15 * sexa(12, 34, 56.7)),
    ("12 34", True, 15 * sexa(12, 34)),
    ("12:34:56.7", False, sexa(12, 34, 56.7)),  # the same text read as degrees
    ("23°26'21.4\"", True, sexa(23, 26, 21.4)),  # a degree mark always means degrees
    ("23 26 21.448", False, OBLIQUITY_1976),
]


@pytest.mark.parametrize("text, hours, degrees", FORMS)
def test_text_to_degrees(text, hours, degrees):
    # 1e-12 deg: only the rounding of the sum.
    assert parse_angle(text, hours_by_default=hours) == pytest.approx(degrees, abs=1e-12)
    cell = evaluate("SKY.ANGLE.HOURS" if hours else "SKY.ANGLE", [text])
    assert cell == pytest.approx(degrees, abs=1e-12)


# Catalogue positions (ICRS, J2000) as SIMBAD gives them in both sexagesimal and decimal
# degrees, from memory.  The decimal form has 8 decimals: tolerance 5e-8 deg, plus the
# sexagesimal form's own last digit.
CATALOGUE = [
    # star, RA text, Dec text, RA deg, Dec deg
    ("Vega", "18h36m56.33635s", "+38°47'01.2802\"", 279.23473479, 38.78368896),
    ("Sirius", "06h45m08.91728s", "-16°42'58.0171\"", 101.28715533, -16.71611586),
    ("Polaris", "02h31m49.09456s", "+89°15'50.7923\"", 37.95456067, 89.26410897),
    ("Betelgeuse", "05h55m10.30536s", "+07°24'25.4304\"", 88.79293899, 7.40706399),
]


@pytest.mark.parametrize("star, ra_text, dec_text, ra, dec", CATALOGUE)
def test_catalogue_positions(star, ra_text, dec_text, ra, dec):
    assert evaluate("SKY.ANGLE", [ra_text]) == pytest.approx(ra, abs=5e-8), star
    assert evaluate("SKY.ANGLE.HOURS", [ra_text.replace("h", ":").replace("m", ":").rstrip("s")]) == (
        pytest.approx(ra, abs=5e-8)
    ), star
    assert evaluate("SKY.ANGLE", [dec_text]) == pytest.approx(dec, abs=5e-8), star
    # And back to text at the catalogue's own precision.
    assert evaluate("SKY.TEXT.HMS", [ra, 5]) == ra_text, star
    back = evaluate("SKY.TEXT.DMS", [dec, 4])
    assert abs(parse_angle(back) - dec) <= 0.5e-4 / 3600 + 5e-8, (star, back)


def test_numbers_pass_through():
    # A number is degrees for SKY.ANGLE and hours for SKY.ANGLE.HOURS (1 h = 15 deg).
    assert evaluate("SKY.ANGLE", [-23.4393]) == -23.4393
    assert evaluate("SKY.ANGLE.HOURS", [12.5]) == 187.5


BAD_TEXT = [
    # text, a word the message must contain
    ("abc", "not an angle"),
    ("", "empty"),
    ("   ", "empty"),
    ("12h34°", "mixes hours and degrees"),
    ("23 26 61", "below 60"),
    ("23 60 00", "below 60"),
    ("23.5 30", "only the last field"),
    ("1 2 3 4", "not an angle"),
    ("23'26°", "out of order"),
    ("--23", "not an angle"),
    ("23°26'21.4\"N", "not an angle"),
    ("1e5", "not an angle"),
    ("nan", "not an angle"),
    ("inf", "not an angle"),
    ("°", "not an angle"),
    ("+", "not an angle"),
    ("12h-3m", "not an angle"),
]


@pytest.mark.parametrize("text, word", BAD_TEXT)
def test_bad_text_gives_a_message(text, word):
    for name in ("SKY.ANGLE", "SKY.ANGLE.HOURS", "SKY.TEXT.DMS", "SKY.WRAP.360"):
        got = evaluate(name, [text])
        assert isinstance(got, str) and got.startswith("#SKY: ") and word in got, (name, got)
    with pytest.raises(ValueError, match=word):
        calcfuncs.call("SKY.ANGLE", text)


@pytest.mark.parametrize("value", [float("nan"), float("inf"), -float("inf"), 1e7, None])
def test_bad_numbers_for_formatting(value):
    for name in ("SKY.TEXT.DMS", "SKY.TEXT.HMS"):
        got = evaluate(name, [value])
        assert isinstance(got, str) and got.startswith("#SKY: "), (name, got)


@pytest.mark.parametrize(
    "args, word",
    [
        ([10.0, 10], "decimals"),
        ([10.0, -1], "decimals"),
        ([10.0, 1.5], "whole number"),
        ([10.0, 1, "DOTS"], 'unknown style "DOTS"'),
    ],
)
def test_bad_format_options(args, word):
    got = evaluate("SKY.TEXT.DMS", args)
    assert got.startswith("#SKY: ") and word in got, got


# ---- degrees -> text --------------------------------------------------------------------------

@pytest.mark.parametrize(
    "name, degrees, decimals, style, text",
    [
        # The IAU 1976 obliquity 23 26' 21.448" (common practice) in each style.
        ("SKY.TEXT.DMS", OBLIQUITY_1976, 3, "MARKS", "+23°26'21.448\""),
        ("SKY.TEXT.DMS", OBLIQUITY_1976, 3, "COLONS", "+23:26:21.448"),
        ("SKY.TEXT.DMS", OBLIQUITY_1976, 3, "SPACES", "+23 26 21.448"),
        ("SKY.TEXT.DMS", -OBLIQUITY_1976, 1, None, "-23°26'21.4\""),  # MARKS, 1 decimal by default
        ("SKY.TEXT.DMS", OBLIQUITY_1976, 0, "MARKS", "+23°26'21\""),
        ("SKY.TEXT.DMS", -0.5, 1, "MARKS", "-00°30'00.0\""),
        ("SKY.TEXT.DMS", 123.5, 1, "MARKS", "+123°30'00.0\""),
        # Vega's right ascension (SIMBAD, from memory) in each style.
        ("SKY.TEXT.HMS", 279.23473479, 2, "MARKS", "18h36m56.34s"),
        ("SKY.TEXT.HMS", 279.23473479, 2, "COLONS", "18:36:56.34"),
        ("SKY.TEXT.HMS", 279.23473479, 2, "SPACES", "18 36 56.34"),
        ("SKY.TEXT.HMS", 279.23473479, 0, None, "18h36m56s"),
        ("SKY.TEXT.HMS", -15.0, 2, None, "23h00m00.00s"),  # brought into 0-360 first
        ("SKY.TEXT.HMS", 375.0, 2, None, "01h00m00.00s"),
        # Rounding carries: 59.96 s at one decimal is the next minute, never 60.0.
        ("SKY.TEXT.DMS", sexa(10, 59, 59.96), 1, None, "+11°00'00.0\""),
        ("SKY.TEXT.DMS", -sexa(10, 59, 59.96), 1, None, "-11°00'00.0\""),
        ("SKY.TEXT.DMS", sexa(10, 58, 59.96), 1, None, "+10°59'00.0\""),
        ("SKY.TEXT.HMS", 15 * sexa(11, 59, 59.996), 2, None, "12h00m00.00s"),
        ("SKY.TEXT.HMS", 15 * sexa(23, 59, 59.996), 2, None, "00h00m00.00s"),  # 24h is 0h
        # Negative zero: a value that rounds to zero shows a plus sign.
        ("SKY.TEXT.DMS", -0.00001, 1, None, "+00°00'00.0\""),
        ("SKY.TEXT.DMS", -0.0, 1, None, "+00°00'00.0\""),
        ("SKY.TEXT.DMS", -0.0001, 0, None, "+00°00'00\""),
        ("SKY.TEXT.DMS", -0.00002, 1, None, "-00°00'00.1\""),  # -0.072" rounds to -0.1"
    ],
)
def test_degrees_to_text(name, degrees, decimals, style, text):
    assert evaluate(name, [degrees, decimals, style]) == text


def _max_error_deg(decimals, hours):
    # Half a unit of the last decimal of the seconds (of time for hours: x15), plus
    # float slack of 1e-9 arcsec for values up to a thousand degrees.
    return (0.5 * 10.0**-decimals * (15.0 if hours else 1.0) + 1e-9) / 3600.0


@settings(max_examples=400, deadline=None)
@given(
    degrees=st.floats(-1000.0, 1000.0, allow_nan=False),
    decimals=st.integers(0, 6),
    style=st.sampled_from(["MARKS", "COLONS", "SPACES"]),
)
@example(degrees=-0.00001, decimals=1, style="MARKS")
@example(degrees=sexa(10, 59, 59.96), decimals=1, style="COLONS")
@example(degrees=-1e-300, decimals=6, style="SPACES")
def test_dms_round_trip(degrees, decimals, style):
    text = dms_text(np.array([degrees]), decimals, style)[0]
    assert abs(parse_angle(text) - degrees) <= _max_error_deg(decimals, False), text
    assert text[0] in "+-"


@settings(max_examples=400, deadline=None)
@given(
    degrees=st.floats(-1000.0, 1000.0, allow_nan=False),
    decimals=st.integers(0, 6),
    style=st.sampled_from(["MARKS", "COLONS", "SPACES"]),
)
@example(degrees=359.9999999, decimals=2, style="MARKS")
@example(degrees=-1e-12, decimals=0, style="COLONS")
def test_hms_round_trip(degrees, decimals, style):
    text = hms_text(np.array([degrees]), decimals, style)[0]
    back = parse_angle(text, hours_by_default=True)
    assert 0.0 <= back < 360.0, text
    diff = (back - degrees + 180.0) % 360.0 - 180.0  # equal modulo a full turn
    assert abs(diff) <= _max_error_deg(decimals, True) + 1e-12, text


# ---- wrapping ----------------------------------------------------------------------------------

@pytest.mark.parametrize(
    "degrees, in_360, in_180",
    [
        # Definition of the ranges [0, 360) and (-180, 180].
        (370.0, 10.0, 10.0),
        (-10.0, 350.0, -10.0),
        (180.0, 180.0, 180.0),
        (-180.0, 180.0, 180.0),
        (540.0, 180.0, 180.0),
        (360.0, 0.0, 0.0),
        (-360.0, 0.0, 0.0),
        (720.5, 0.5, 0.5),
        (0.0, 0.0, 0.0),
        (-1e-20, 0.0, -1e-20),
        ("-23 26 21.4", 360 - sexa(23, 26, 21.4), -sexa(23, 26, 21.4)),  # angle text too
    ],
)
def test_wrap_table(degrees, in_360, in_180):
    got_360 = evaluate("SKY.WRAP.360", [degrees])
    got_180 = evaluate("SKY.WRAP.180", [degrees])
    assert 0.0 <= got_360 < 360.0 and -180.0 < got_180 <= 180.0
    assert got_360 == pytest.approx(in_360, abs=1e-12)
    assert got_180 == pytest.approx(in_180, abs=1e-12)


@settings(max_examples=500, deadline=None)
@given(st.floats(-1e6, 1e6, allow_nan=False))
@example(-1e-300)
@example(-5e-324)
@example(np.nextafter(-180.0, 0.0))
@example(np.nextafter(180.0, 1000.0))
@example(np.nextafter(360.0, 0.0))
@example(-0.0)
def test_wrap_ranges(x):
    w360, w180 = float(wrap_360(x)), float(wrap_180(x))
    assert 0.0 <= w360 < 360.0
    assert -180.0 < w180 <= 180.0
    # Same direction: they differ from x by whole turns (to the rounding of x itself).
    slack = 4 * np.spacing(max(abs(x), 360.0))
    for w in (w360, w180):
        turns = (x - w) / 360.0
        assert abs(turns - round(turns)) * 360.0 <= slack, (x, w)
