"""What a declaration is made of, and the arguments several families share.

``Arg`` and ``CellFunction`` are the columns of the registry's table: each says what
the build, the adapter, the cell layer and the API need as typed fields (an argument's
kind and the noun its messages use, a function's result kind), and the Function Wizard
words beside them.  Nothing reads behaviour back out of the words.

Words that name a model, a scale, a system or a validity span are formatted from
``calcfuncs.vocabulary``, the one place that says them.  Imports nothing heavy.
"""

from dataclasses import dataclass, field, replace
from functools import cached_property

from .. import vocabulary as vocab

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
# A "series" argument takes a whole range as one value: the rows of a data set that the
# function reduces to one result (a light curve to its time of minimum).  Its ranges never
# make an array result; a function with series arguments has no row-wise ones.
SERIES_KINDS = ("series",)

# What a function gives back.  "number": a number per cell.  "text": one text per
# cell, returned to Calc as a plain value (see CellFunction.returns_text).
# "datetime": a Calc date-time value, days since the document's null date (made from
# the core's DateTimes by the cell layer only); rows with no instant to show (a polar
# night for a sunrise) hold words instead.
RESULT_KINDS = ("number", "text", "datetime")


@dataclass(frozen=True)
class Arg:
    """One argument of a cell function, in the order the cell takes them."""

    name: str
    kind: str
    description: str
    default: object = REQUIRED
    choices: tuple = ()
    aliases: tuple = ()  # (other spelling, choice) pairs
    # What the argument is called in a cell's message ('unknown nutation model "X"');
    # the name itself unless said.
    noun: str = None

    def __post_init__(self):
        if self.noun is None:
            object.__setattr__(self, "noun", self.name)

    @property
    def optional(self):
        return self.default is not REQUIRED

    @property
    def wizard_description(self):
        """The argument's text in the Function Wizard and the reference.

        Calc decides "(optional)" from the UNO type alone: every parameter of type
        ``any`` is optional to it (sc/source/core/tool/addincol.cxx), so its wizard marks
        all of ours so.  A stricter type (double, string, an array) would make Calc
        itself refuse an omitted or ill-typed argument with an Err:5xx before our code
        sees it, where a ``#SKY:`` message belongs.  So the type stays ``any`` and the
        words say it instead, first, where the eye lands."""
        if self.optional:
            return self.description + " (optional)"
        return "Required. " + self.description

    @property
    def idl_name(self):
        """The parameter's name in the IDL and the xcu (UNO names take no underscore)."""
        head, *rest = self.name.split("_")
        return head + "".join(w.capitalize() for w in rest)


@dataclass(frozen=True)
class CellFunction:
    """One cell function: what the user sees and where the core computes it.

    ``result`` is the Wizard's words for the result; ``result_kind`` (one of
    RESULT_KINDS) is what the adapter, the cell layer and the API act on.  ``family``
    is filled in by the ``Family`` that lists the function.  ``fills_down`` names the
    argument that a sheet steps by one (a day, a year) from row to row when the formula
    is filled down a column of days or years: the cell layer then computes the rows
    ahead in one call (cells.py)."""

    name: str
    method: str
    summary: str
    args: tuple
    result: str
    impl: str
    model: str = ""
    result_kind: str = "number"
    family: str = ""
    fills_down: str = ""

    def __post_init__(self):
        if self.result_kind not in RESULT_KINDS:
            raise ValueError(f"{self.name}: result_kind {self.result_kind!r} is not one of "
                             f"{RESULT_KINDS}")
        if self.fills_down and self.fills_down not in [a.name for a in self.args]:
            raise ValueError(f"{self.name}: fills_down {self.fills_down!r} is not an argument")

    @property
    def returns_text(self):
        """A function whose result is a text returns one plain value to Calc, not a 1x1
        array: LibreOffice 7.4 compares a text taken from an add-in's array result as
        unequal to the same typed text (=A1="..." is FALSE), which would make an
        IF() on our text silently wrong.  Such a function takes one cell at a time."""
        return self.result_kind == "text"

    @property
    def returns_datetime(self):
        """The result is a date-time value, days since the document's null date."""
        return self.result_kind == "datetime"

    @cached_property  # asked on every call of the function (frozen: kept in __dict__)
    def reduces_series(self):
        """Whether the function reduces whole ranges (series arguments) to one value."""
        return any(a.kind in SERIES_KINDS for a in self.args)

    @property
    def has_time(self):
        return any(a.kind == "time" for a in self.args)

    @property
    def uses_null_date(self):
        """Whether the document's null date matters: to read a date-time cell given as
        a time argument, or to make a date-time value of the result."""
        return self.has_time or self.returns_datetime

    @property
    def description(self):
        """The Function Wizard text: what it does, what it returns, model and validity."""
        parts = [self.summary, "Result: " + self.result + "."]
        if self.model:
            parts.append(self.model)
        if self.returns_text:
            parts.append("One cell at a time: fill the formula down (a text result is "
                         "never an array, so that comparing it with typed text works).")
        elif self.reduces_series:
            parts.append("Takes whole ranges and returns one value; empty rows are "
                         "skipped.")
        else:
            parts.append("Accepts a range in any argument and then returns an array.")
        return " ".join(parts)


@dataclass(frozen=True)
class Family:
    """A family of functions: its name and title said once, for all its members."""

    name: str
    title: str
    functions: tuple = field(default=())

    def __post_init__(self):
        object.__setattr__(self, "functions",
                           tuple(replace(f, family=self.name) for f in self.functions))


# ---- wording formatted from the vocabulary ------------------------------------------------


def span_text(span):
    """A span of years as the Wizard texts write it: 1000-3000, or -8000 to 12000 when
    a minus sign would make the dash ambiguous."""
    low, high = span
    return f"{low:g}-{high:g}" if low >= 0 else f"{low:g} to {high:g}"


def words(items, last="or"):
    """A list in prose: "A, B or C"."""
    items = list(items)
    return items[0] if len(items) == 1 else ", ".join(items[:-1]) + f" {last} " + items[-1]


def choices_text(choices, notes):
    """The choices in their order, each with its note in brackets where it has one:
    "AUTO (default: ...), IAU2006 (...) or VONDRAK2011 (...)".  A note for a word that
    is not a choice is a mistake in the declaration."""
    stray = set(notes) - set(choices)
    if stray:
        raise ValueError(f"notes for words that are not choices: {sorted(stray)}")
    return words(f"{c} ({notes[c]})" if notes.get(c) else c for c in choices)


# ---- arguments and notes shared across families -----------------------------------------

SCALES = vocab.SCALES


def time_arg(name="time"):
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


SCALE = Arg(
    "scale",
    "scale",
    "Time scale of the time argument: "
    + ", ".join((vocab.ERFA_SCALES[0] + " (default)",) + vocab.ERFA_SCALES[1:])
    + ", UT (universal time at any date through Delta T; UT "
    + vocab.DELTA_T_MODELS[-1] + " or UT 10850 name the model or give Delta T in seconds) "
    "or LMT and an east longitude (local mean time, e.g. LMT 12.4964).",
    default="UTC",
    choices=SCALES,
)
RESULT_SCALE = Arg(
    "result_scale",
    "scale",
    "Time scale of the result, as for scale. Default: the scale of the input.",
    default=None,
    choices=SCALES,
)
# The result scale of an event search: by default the scale of the instant searched from.
EVENT_RESULT_SCALE = Arg("result_scale", "scale", "Time scale of the result. Default: that "
                         "of the time argument.", default=None, choices=SCALES)
DUT1 = Arg(
    "dut1",
    "seconds",
    "UT1 - UTC in seconds (within +-1 s, as published in IERS Bulletin A), used only "
    "when UT1 is involved. Default 0, which leaves UT1 up to 0.9 s in error.",
    default=0.0,
)
INSTANT = Arg("time", "time", "The instant (as for SKY.JD).")


def angle_arg(name, what):
    return Arg(name, "angle", f"{what}, in decimal degrees or as angle text.")


LATITUDE = Arg("latitude", "angle",
               "Geodetic latitude of the site in degrees (north positive), or angle text.")
LONGITUDE = Arg("longitude", "angle",
                "Longitude of the site in degrees, EAST positive (west negative), or angle text.")
HEIGHT = Arg("height", "number",
             "Height of the site above the WGS84 ellipsoid in metres. Default 0.", default=0.0)
# A body's place seen from a site: the height matters for the parallax, and the air for
# the refraction of altitudes (one wording for every family that takes them).
PARALLAX_HEIGHT = Arg("height", "number", "Height of the site above the WGS84 ellipsoid in "
                      "metres (for the parallax). Default 0.", default=0.0)
PRESSURE = Arg("pressure", "real", "Air pressure at the site in hPa for refraction. "
               "Default 0: no refraction (the geometric place).", default=0.0)
TEMPERATURE = Arg("temperature", "real", "Air temperature at the site in degrees C, used "
                  "with the pressure. Default 10.", default=10.0)

# The place of a body (the Sun, the Moon, a planet): its frame and kind.
PLACE_FRAME = Arg("frame", "choice", "TRUE (default: true equinox of date, as almanacs give "
                  "apparent places), DATE (mean equinox of date) or J2000.",
                  default="TRUE", choices=("TRUE", "DATE", "J2000"))
PLACE_KIND = Arg("kind", "choice", "APPARENT (default: light time and aberration), "
                 "ASTROMETRIC (light time only) or GEOMETRIC (neither).",
                 default="APPARENT", choices=vocab.KINDS)
SOURCE = Arg("source", "source",
             f"Ephemeris: {vocab.BUILTIN} (default; ERFA's theories, no set-up), DE440 (JPL; "
             "an excerpt for 1900-2100 comes with the add-in, a full de440.bsp in your "
             "kernel folder widens it), DE441 (JPL; its files in your kernel folder) or the "
             "full path of a JPL .bsp kernel file. Put it in one cell and refer to it to "
             "choose for a whole sheet.",
             default=vocab.BUILTIN)
SOURCE_NOTE = (
    "With a JPL kernel (source DE440, DE441 or a .bsp path, read with jplephem after its "
    "structure is checked) every date is checked against the kernel's segments; our "
    "results agree with skyfield and DE440 to 0.001 arcsec."
)

# The coordinate systems of frames.py, as the Wizard names them.
SYSTEMS_TEXT = choices_text(vocab.SYSTEMS, {
    "EQUATORIAL J2000": "mean equator and equinox of J2000.0",
    "EQUATORIAL DATE": "mean of date",
    "EQUATORIAL TRUE": "true equator and equinox of date",
    "ECLIPTIC J2000": "IAU 2006 ecliptic",
    "ECLIPTIC DATE": "mean ecliptic and equinox of date",
    "ECLIPTIC TRUE": "true equinox of date",
}) + " (EQ and ECL abbreviate)"


def system_arg(name, role):
    """A coordinate system argument, required: no system is ever assumed."""
    return Arg(name, "choice", f"Coordinate system {role}: " + SYSTEMS_TEXT + ". No default: "
               "always say which.", choices=vocab.SYSTEMS, aliases=vocab.SYSTEM_ALIASES)


# The built-in source outside ERFA's years: one text for every place, season and eclipse
# function that reaches that far (figures: tests/test_longrange.py).
LONG_RANGE_NOTE = (
    f"BUILTIN outside {span_text(vocab.BUILTIN_YEARS)} (accepted "
    f"{span_text(vocab.LONG_RANGE_YEARS)}): the Earth and the planets from VSOP87D "
    "(Bretagnon and Francou 1988, truncated), the Moon from Meeus's abridged ELP-2000/82; "
    "against DE440 over 1550-2650 their geocentric directions differed by at most "
    + ", ".join(f"{arcsec:g}\" {body.capitalize()}" for body, arcsec in vocab.LONG_RANGE_VS_DE440)
    + " (the Moon 3\" rms) in our tests, more further out. There the mean "
    "equator and ecliptic of date follow the long-term precession of Vondrak et al. (2011) "
    "and the nutation is the IAU 2000B series as it stands (its error so far from the "
    "present is not published). Before 1600 a clock time reaches TT through Delta T "
    "(scale UT): its published standard error (SKY.DELTAT.UNCERTAINTY) is about 8 minutes "
    "in 600 BC, which moves the Moon by 4' and turns the sky by 2 degrees. The Moon's mean "
    "motion follows DE440's tidal acceleration, the value the default SMH2016 Delta T is "
    "tied to (about -25.8\"/cy^2); ESPENAK2006's is -26\"/cy^2, whose published correction "
    "(about 100 s in 600 BC) is not applied."
)
