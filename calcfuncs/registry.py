"""The one declaration of every Eclipsheet cell function.

Everything else is driven from this list: the UNO IDL and type library, the Function
Wizard texts (``CalcAddIns.xcu``), the components file, the function reference in
``docs/functions.md``, and the adapter's dispatch.  Declare a function here once and
the build does the rest.

Frozen names: ``IMPLEMENTATION_NAME`` and every ``method`` are stored inside each ODS
file that uses the function (``of:=ORG.ECLIPSHEET.SKY.SKYFUNCTIONS.SKYJD(...)``).  They
are a file format: never rename or remove one, add a new function instead.  A test
pins the full list.

This module imports nothing heavy; the ``impl`` of a function is a ``module:function``
path inside ``calcfuncs`` that the cell layer imports on first use.
"""

from dataclasses import dataclass

IMPLEMENTATION_NAME = "org.eclipsheet.sky.SkyFunctions"
INTERFACE_MODULE = ("org", "eclipsheet", "sky")
INTERFACE_NAME = "XSkyFunctions"
SERVICE_NAMES = ("com.sun.star.sheet.AddIn",)
EXTENSION_IDENTIFIER = "org.eclipsheet.sky"
CATEGORY = "Add-In"

REQUIRED = object()

# How a cell value is read, per argument kind.  Row-wise kinds are read cell by cell,
# so a whole-column call can mix good and bad rows; option kinds are one word or
# number shared by the rows that give the same one.
ROW_KINDS = ("time", "number", "angle", "text")
OPTION_KINDS = ("choice", "count", "seconds")

SCALES = ("UTC", "TAI", "TT", "TDB", "UT1")
OBLIQUITY_MODELS = ("IAU2006", "IAU1980", "NEWCOMB", "LASKAR1986", "VONDRAK2011")
NUTATION_MODELS = ("IAU2000A", "IAU2000B", "IAU1980")
ANGLE_UNITS = ("DEG", "ARCSEC", "RAD")
TEXT_STYLES = ("MARKS", "COLONS", "SPACES")


@dataclass(frozen=True)
class Arg:
    """One argument of a cell function, in the order the cell takes them."""

    name: str
    kind: str
    description: str
    default: object = REQUIRED
    choices: tuple = ()

    @property
    def optional(self):
        return self.default is not REQUIRED

    @property
    def idl_name(self):
        """The parameter's name in the IDL and the xcu (UNO names take no underscore)."""
        head, *rest = self.name.split("_")
        return head + "".join(w.capitalize() for w in rest)


@dataclass(frozen=True)
class CellFunction:
    """One cell function: what the user sees and where the core computes it."""

    name: str
    method: str
    family: str
    summary: str
    args: tuple
    result: str
    impl: str
    model: str = ""

    @property
    def description(self):
        """The Function Wizard text: what it does, what it returns, model and validity."""
        parts = [self.summary, "Result: " + self.result + "."]
        if self.model:
            parts.append(self.model)
        parts.append("Accepts a range in any argument and then returns an array.")
        return " ".join(parts)

    @property
    def has_time(self):
        return any(a.kind == "time" for a in self.args)


# Shared argument declarations, so one word means one thing in every function.

def _time(name="time"):
    return Arg(
        name,
        "time",
        "The instant: a date-time cell (the document's null date is honoured), ISO 8601 "
        'text such as "2024-03-20T03:06:00Z" or "2024-03-20 03:06:00.25", or text '
        '"JD 2460389.629" or "MJD 60389.129". UTC and UT1 from 1960 on; calendar dates '
        "from 1582-10-15 on (Gregorian); JD or MJD text on TT, TDB or TAI at any date.",
    )


_SCALE = Arg(
    "scale",
    "choice",
    "Time scale of the time argument: UTC (default), TAI, TT, TDB or UT1.",
    default="UTC",
    choices=SCALES,
)
_RESULT_SCALE = Arg(
    "result_scale",
    "choice",
    "Time scale of the result: UTC, TAI, TT, TDB or UT1. Default: the scale of the input.",
    default=None,
    choices=SCALES,
)
_DUT1 = Arg(
    "dut1",
    "seconds",
    "UT1 - UTC in seconds (within +-1 s, as published in IERS Bulletin A), used only "
    "when UT1 is involved. Default 0, which leaves UT1 up to 0.9 s in error.",
    default=0.0,
)
_OBLIQUITY_MODEL = Arg(
    "model",
    "choice",
    "Mean obliquity formula: IAU2006 (default; 1000-3000), IAU1980 (1000-3000), NEWCOMB "
    "(900-2900), LASKAR1986 (-8000 to 12000) or VONDRAK2011 (-198000 to 202000).",
    default="IAU2006",
    choices=OBLIQUITY_MODELS,
)
_NUTATION_MODEL = Arg(
    "nutation",
    "choice",
    "Nutation series: IAU2000A (default), IAU2000B or IAU1980; each valid 1000-3000.",
    default="IAU2000A",
    choices=NUTATION_MODELS,
)
_ANGLE_UNIT = Arg(
    "unit",
    "choice",
    "Unit of the result: DEG (default, decimal degrees), ARCSEC or RAD.",
    default="DEG",
    choices=ANGLE_UNITS,
)


def _jd_number(name, what):
    return Arg(name, "number", f"The {what} as a number, read on the time scale given next.")


_DOUBLE_LIMIT = (
    "A JD held in one cell resolves about 40 microseconds (an MJD or a date-time "
    "cell about 1 microsecond); the computation inside keeps the full precision."
)
_UTC_NOTE = (
    "UTC uses ERFA's leap-second table (last leap second 2016-12-31) and assumes none "
    "since; 23:59:60 is accepted on real leap seconds. TT = TAI + 32.184 s; TDB - TT "
    "from ERFA dtdb (Fairhead-Bretagnon, geocentre) for 1000-3000, and outside those "
    "years from the two-term approximation 0.001657 sin g + 0.000014 sin 2g (tens of "
    "microseconds)."
)
_QUASI_JD = (
    "A JD or MJD on UTC is ERFA's quasi-JD: on a day that ends in a leap second (or a "
    "1960s step) the day's fraction spreads over its real length, so 23:59:60 has a place."
)

_OBLIQUITY_MODELS_TEXT = (
    "Models: IAU2006 (Hilton et al. 2006, ERFA obl06), IAU1980 (Lieske et al. 1977, "
    "ERFA obl80), NEWCOMB (Newcomb's formula, tropical centuries from B1900.0), "
    "LASKAR1986 (Laskar 1986 polynomial, 10,000-year units), VONDRAK2011 (angle between "
    "the long-term equator and ecliptic poles of Vondrak et al. 2011, ERFA ltpequ/ltpecl). "
    "Outside a model's range the cell says so and names one that covers the date."
)
_NUTATION_MODELS_TEXT = (
    "Series: IAU2000A (Mathews et al. 2002 with the IAU 2006 adjustments, ERFA nut06a), "
    "IAU2000B (McCarthy and Luzum 2003, 1 mas within 1995-2050, ERFA nut00b), IAU1980 "
    "(Wahr 1981, ERFA nut80). Outside 1000-3000 the cell says so."
)


FUNCTIONS = (
    # ---- time -------------------------------------------------------------------
    CellFunction(
        name="SKY.JD",
        method="skyJd",
        family="time",
        summary="Julian Date of an instant, on a chosen time scale.",
        args=(_time(), _SCALE, _RESULT_SCALE, _DUT1),
        result="Julian Date in days on the result scale",
        impl="timefuncs:julian_date",
        model=_DOUBLE_LIMIT + " " + _UTC_NOTE + " " + _QUASI_JD,
    ),
    CellFunction(
        name="SKY.MJD",
        method="skyMjd",
        family="time",
        summary="Modified Julian Date (JD - 2400000.5) of an instant, on a chosen time scale.",
        args=(_time(), _SCALE, _RESULT_SCALE, _DUT1),
        result="Modified Julian Date in days on the result scale",
        impl="timefuncs:modified_julian_date",
        model=_UTC_NOTE + " " + _QUASI_JD,
    ),
    CellFunction(
        name="SKY.DATETIME",
        method="skyDatetime",
        family="time",
        summary="The instant as a Calc date-time value on another time scale (UTC to TT, "
        "TT to TDB and so on); format the cell as a date-time to read it.",
        args=(_time(), _SCALE, _RESULT_SCALE, _DUT1),
        result="date-time value (days since the document's null date) on the result scale; "
        "an instant inside a leap second gives a message, since a date-time cell cannot "
        "show 23:59:60 (use SKY.TEXT.ISO)",
        impl="timefuncs:calc_datetime",
        model=_UTC_NOTE,
    ),
    CellFunction(
        name="SKY.JD.DATETIME",
        method="skyJdDatetime",
        family="time",
        summary="A Julian Date number turned back into a Calc date-time value.",
        args=(_jd_number("jd", "Julian Date"), _SCALE, _RESULT_SCALE, _DUT1),
        result="date-time value (days since the document's null date) on the result scale",
        impl="timefuncs:calc_datetime_from_jd",
        model=_UTC_NOTE,
    ),
    CellFunction(
        name="SKY.MJD.DATETIME",
        method="skyMjdDatetime",
        family="time",
        summary="A Modified Julian Date number turned back into a Calc date-time value.",
        args=(_jd_number("mjd", "Modified Julian Date"), _SCALE, _RESULT_SCALE, _DUT1),
        result="date-time value (days since the document's null date) on the result scale",
        impl="timefuncs:calc_datetime_from_mjd",
        model=_UTC_NOTE,
    ),
    CellFunction(
        name="SKY.TEXT.ISO",
        method="skyTextIso",
        family="time",
        summary="The instant as ISO 8601 text on a chosen time scale, leap seconds shown as "
        "23:59:60.",
        args=(
            _time(),
            _SCALE,
            _RESULT_SCALE,
            _DUT1,
            Arg(
                "decimals",
                "count",
                "Decimal places of the seconds, 0 to 9. Default 3.",
                default=3,
            ),
        ),
        result='text such as "2024-03-20T03:06:00.000" (no zone letter: the scale is the '
        "one asked for)",
        impl="timefuncs:iso_text",
        model=_UTC_NOTE,
    ),
    CellFunction(
        name="SKY.DELTAT",
        method="skyDeltaT",
        family="time",
        summary="Delta T = TT - UT1 at an instant, from the leap-second table and DUT1.",
        args=(_time(), _SCALE, _DUT1),
        result="seconds",
        impl="timefuncs:delta_t",
        model="Computed as 32.184 s + (TAI - UTC) - DUT1, so defined from 1960 on; "
        "before 1960 the cell says so. " + _UTC_NOTE,
    ),
    # ---- angles -----------------------------------------------------------------
    CellFunction(
        name="SKY.ANGLE",
        method="skyAngle",
        family="angles",
        summary="Sexagesimal or decimal text to decimal degrees: -23°26'21.4\", "
        "-23 26 21.4, -23:26:21.4, 23d26m21.4s or -23.4393; text marked with h "
        "(12h34m56.7s) is read as hours.",
        args=(
            Arg(
                "text",
                "text",
                "The angle as text (unmarked fields are degrees, arcminutes, arcseconds), "
                "or a number of degrees, which is returned as it is.",
            ),
        ),
        result="decimal degrees",
        impl="angles:angle_from_text",
    ),
    CellFunction(
        name="SKY.ANGLE.HOURS",
        method="skyAngleHours",
        family="angles",
        summary="Right-ascension style text to decimal degrees: 12:34:56.7, 12 34 56.7 "
        "and 12h34m56.7s are hours, minutes, seconds of time (1 h = 15 degrees).",
        args=(
            Arg(
                "text",
                "text",
                "The angle as text (unmarked fields are hours, minutes, seconds), or a "
                "number of hours.",
            ),
        ),
        result="decimal degrees",
        impl="angles:angle_from_hours_text",
    ),
    CellFunction(
        name="SKY.TEXT.DMS",
        method="skyTextDms",
        family="angles",
        summary="Decimal degrees to signed degrees, arcminutes, arcseconds text, as "
        "declinations and latitudes are written.",
        args=(
            Arg("degrees", "angle", "The angle in decimal degrees (or angle text)."),
            Arg("decimals", "count", "Decimal places of the arcseconds, 0 to 9. Default 1.",
                default=1),
            Arg("style", "choice",
                "MARKS (default, +23°26'21.4\"), COLONS (+23:26:21.4) or SPACES "
                "(+23 26 21.4).", default="MARKS", choices=TEXT_STYLES),
        ),
        result="text such as +23°26'21.4\"",
        impl="angles:dms_text",
    ),
    CellFunction(
        name="SKY.TEXT.HMS",
        method="skyTextHms",
        family="angles",
        summary="Decimal degrees to hours, minutes, seconds text (1 h = 15 degrees), as "
        "right ascensions are written; the angle is first brought into 0-360 degrees.",
        args=(
            Arg("degrees", "angle", "The angle in decimal degrees (or angle text)."),
            Arg("decimals", "count", "Decimal places of the seconds, 0 to 9. Default 2.",
                default=2),
            Arg("style", "choice",
                "MARKS (default, 12h34m56.78s), COLONS (12:34:56.78) or SPACES "
                "(12 34 56.78).", default="MARKS", choices=TEXT_STYLES),
        ),
        result='text such as "12h34m56.78s"',
        impl="angles:hms_text",
    ),
    CellFunction(
        name="SKY.WRAP.360",
        method="skyWrap360",
        family="angles",
        summary="An angle brought into the range 0 to 360 degrees (360 excluded).",
        args=(Arg("degrees", "angle", "The angle in decimal degrees (or angle text)."),),
        result="decimal degrees in [0, 360)",
        impl="angles:wrap_360",
    ),
    CellFunction(
        name="SKY.WRAP.180",
        method="skyWrap180",
        family="angles",
        summary="An angle brought into the range -180 to +180 degrees (-180 excluded).",
        args=(Arg("degrees", "angle", "The angle in decimal degrees (or angle text)."),),
        result="decimal degrees in (-180, 180]",
        impl="angles:wrap_180",
    ),
    # ---- obliquity and nutation --------------------------------------------------
    CellFunction(
        name="SKY.OBLIQUITY",
        method="skyObliquity",
        family="obliquity",
        summary="Mean obliquity of the ecliptic: the angle between the mean equator and "
        "the ecliptic of date.",
        args=(_time(), _SCALE, _OBLIQUITY_MODEL, _ANGLE_UNIT),
        result="angle in the chosen unit (degrees by default)",
        impl="obliquity:mean_obliquity_cells",
        model=_OBLIQUITY_MODELS_TEXT + " The date is taken as TT (TDB for the IAU "
        "formulas; the difference is negligible here).",
    ),
    CellFunction(
        name="SKY.OBLIQUITY.TRUE",
        method="skyObliquityTrue",
        family="obliquity",
        summary="True obliquity of the ecliptic: mean obliquity plus the nutation in "
        "obliquity, the angle between the true equator and the ecliptic of date.",
        args=(_time(), _SCALE, _OBLIQUITY_MODEL, _NUTATION_MODEL, _ANGLE_UNIT),
        result="angle in the chosen unit (degrees by default)",
        impl="obliquity:true_obliquity_cells",
        model=_OBLIQUITY_MODELS_TEXT + " " + _NUTATION_MODELS_TEXT + " Consistent pairs "
        "are IAU2006 with IAU2000A and IAU1980 with IAU1980.",
    ),
    CellFunction(
        name="SKY.NUTATION.LON",
        method="skyNutationLon",
        family="obliquity",
        summary="Nutation in longitude (delta psi): the shift of the true equinox along "
        "the ecliptic from the mean equinox.",
        args=(_time(), _SCALE, _NUTATION_MODEL, _ANGLE_UNIT),
        result="angle in the chosen unit (degrees by default; ARCSEC is usual)",
        impl="obliquity:nutation_lon_cells",
        model=_NUTATION_MODELS_TEXT,
    ),
    CellFunction(
        name="SKY.NUTATION.OBL",
        method="skyNutationObl",
        family="obliquity",
        summary="Nutation in obliquity (delta epsilon): true minus mean obliquity.",
        args=(_time(), _SCALE, _NUTATION_MODEL, _ANGLE_UNIT),
        result="angle in the chosen unit (degrees by default; ARCSEC is usual)",
        impl="obliquity:nutation_obl_cells",
        model=_NUTATION_MODELS_TEXT,
    ),
)

FUNCTIONS = FUNCTIONS + (
    CellFunction(
        name="SKY.VERSION",
        method="skyVersion",
        family="about",
        summary="Which Eclipsheet and ERFA computed this sheet, for the record kept with it.",
        args=(),
        result='text such as "Eclipsheet 0.1.0; ERFA 2.0.1; numpy 2.4.6"',
        impl="about:version_text",
    ),
)

FAMILIES = {
    "about": "About the add-in",
    "time": "Time: Julian dates and time scales",
    "angles": "Angles: sexagesimal text, formatting, wrapping",
    "obliquity": "Obliquity of the ecliptic and nutation",
}

BY_NAME = {f.name: f for f in FUNCTIONS}
BY_METHOD = {f.method: f for f in FUNCTIONS}
