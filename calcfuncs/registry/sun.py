"""The Sun and the year: its place, the seasons, rise and set, the equation of time."""

from .. import vocabulary as vocab
from .common import (INSTANT, LATITUDE, LONGITUDE, PLACE_FRAME, PLACE_KIND, SCALE, SCALES,
                     LONG_RANGE_NOTE, SOURCE, SOURCE_NOTE, Arg, CellFunction,
                     EVENT_RESULT_SCALE, Family, angle_arg, span_text)

_SUN_MODEL = (
    "The Earth from ERFA epv00 (fit to 1900-2100, a few km there; "
    f"used over {span_text(vocab.BUILTIN_YEARS)} with slowly degrading accuracy); light "
    "time and annual aberration (ERFA ab) for APPARENT; frames as SKY.COORD: J2000 "
    "(ecliptic/equator and equinox of J2000.0), DATE (mean of date) or TRUE (true "
    "equinox, nutation included). Geocentric. " + vocab.SUN_CAUTION
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
_YEAR = Arg("year", "number", "The year (Gregorian), "
            f"{vocab.LONG_RANGE_YEARS[0] + 1:g} to {vocab.LONG_RANGE_YEARS[1] - 1:g}.")
_SEASON_MODEL = (
    "Found by one event search on the Sun's apparent longitude (light time, aberration, "
    "nutation: the true equinox of date), to well under a second. " + _SUN_MODEL + " "
    + LONG_RANGE_NOTE
)
_RISE_MODEL = (
    "Searched over the local day on the Sun's geocentric apparent altitude (IAU "
    "2006/2000A, ERFA epv00; parallax under 9\" neglected, so times good to a few "
    "seconds, and to a minute or so near the poles). When the event does not happen the "
    "cell says so in words (polar day, polar night). Results on the date's scale plus "
    "utc_offset; format the cell as a time. " + vocab.SUN_CAUTION
)
_PLACE_ARGS = (INSTANT, SCALE, PLACE_FRAME, PLACE_KIND, SOURCE)
_DAY_AT_SITE = (_LOCAL_DATE, LATITUDE, LONGITUDE, SCALE, _UTC_OFFSET)
_RISE_ARGS = _DAY_AT_SITE + (_SUN_EVENT, _SUN_HEIGHT)
_TARGET_AT = (angle_arg("ra", "RA of the target (ICRS, a catalogue place)"),
              angle_arg("dec", "Dec of the target (ICRS)"), INSTANT, SCALE)


def _sun_place(name, method, summary, result, impl, args=_PLACE_ARGS):
    return CellFunction(name=name, method=method, summary=summary, args=args,
                        result=result, impl=impl, model=_SUN_MODEL + " " + LONG_RANGE_NOTE + " " + SOURCE_NOTE)


def _rise_fn(name, method, summary, impl):
    return CellFunction(name=name, method=method, summary=summary, args=_RISE_ARGS,
                        result="a date-time value (local), or a text when it does not happen",
                        result_kind="datetime", impl=impl, model=_RISE_MODEL,
                        fills_down="date")


FAMILY = Family("sun", f"The Sun and the year ({vocab.SUN_CAUTION_SHORT})", (
    _sun_place("SKY.SUN.LON", "skySunLon", "Ecliptic longitude of the Sun, geocentric.",
               "degrees in [0, 360)", "sun:lon_cells"),
    _sun_place("SKY.SUN.LAT", "skySunLat", "Ecliptic latitude of the Sun, geocentric "
               "(under 1\" from the ecliptic of date).", "degrees", "sun:lat_cells"),
    _sun_place("SKY.SUN.RA", "skySunRa", "Right ascension of the Sun, geocentric.",
               "degrees in [0, 360)", "sun:ra_cells"),
    _sun_place("SKY.SUN.DEC", "skySunDec", "Declination of the Sun, geocentric.",
               "degrees", "sun:dec_cells"),
    _sun_place("SKY.SUN.DIST", "skySunDist", "Distance of the Sun from the Earth's centre.",
               "astronomical units", "sun:distance_cells", args=(INSTANT, SCALE, SOURCE)),
    CellFunction(
        name="SKY.SUN.SOLARLON", method="skySunSolarlon",
        summary="Solar longitude as meteor work indexes showers: the Sun's apparent "
        "longitude on the ecliptic and equinox of J2000.0.",
        args=(INSTANT, SCALE), result="degrees in [0, 360)",
        impl="sun:solar_longitude_cells",
        model="The same as SKY.SUN.LON with frame J2000 and kind APPARENT (common practice "
        "in meteor work). " + _SUN_MODEL,
    ),
    CellFunction(
        name="SKY.SUN.EQTIME", method="skySunEqtime",
        summary="Equation of time: apparent minus mean solar time (a sundial is fast when "
        "it is positive).",
        args=(INSTANT, SCALE), result="minutes",
        impl="sun:equation_of_time_cells",
        model="Greenwich hour angle of the apparent Sun (GAST - RA, IAU 2006/2000A) minus "
        "UT - 12 h. " + _SUN_MODEL,
    ),
    CellFunction(
        name="SKY.SUN.SUNDIAL", method="skySunSundial",
        summary="Local apparent (sundial) time at a longitude: UT + longitude/15 h + the "
        "equation of time.",
        args=(INSTANT, LONGITUDE, SCALE), result="a date-time value (sundial time)",
        result_kind="datetime",
        impl="sun:sundial_time_cells", model=_SUN_MODEL,
    ),
    CellFunction(
        name="SKY.SEASON", method="skySeason",
        summary="Instant of an equinox or solstice of a year: when the Sun's apparent "
        "longitude is 0, 90, 180 or 270 degrees.",
        args=(_YEAR, _SEASON_EVENT,
              Arg("result_scale", "scale", "Time scale of the result: UTC (default), TT, "
                  "UT (before 1960) and the others of SKY.JD.", default="UTC",
                  choices=SCALES)),
        result="a date-time value on the result scale",
        result_kind="datetime",
        impl="sun:season_cells", model=_SEASON_MODEL, fills_down="year",
    ),
    CellFunction(
        name="SKY.SEASON.LENGTH", method="skySeasonLength",
        summary="Length of the season that an equinox or solstice opens, to the next one.",
        args=(_YEAR, _SEASON_EVENT),
        result="days", impl="sun:season_length_cells", model=_SEASON_MODEL,
        fills_down="year",
    ),
    CellFunction(
        name="SKY.SUN.REACHES", method="skySunReaches",
        summary="The next instant after a given time when the Sun's longitude reaches a "
        "value (for a shower's peak longitude, or any solar longitude).",
        args=(angle_arg("longitude", "The solar longitude to reach"),
              Arg("time", "time", "Search from this instant on (as for SKY.JD); the first "
                  "crossing after it is returned, within a year."),
              SCALE,
              Arg("frame", "choice", "J2000 (default: the meteor-work solar longitude, "
                  "apparent on the ecliptic of J2000.0), TRUE or DATE.", default="J2000",
                  choices=("J2000", "TRUE", "DATE")),
              EVENT_RESULT_SCALE),
        result="a date-time value on the result scale",
        result_kind="datetime",
        impl="sun:reaches_cells", model=_SEASON_MODEL,
    ),
    _rise_fn("SKY.SUN.RISE", "skySunRise", "Sunrise (or the start of morning twilight) at a "
             "site on a local date.", "sun:rise_cells"),
    _rise_fn("SKY.SUN.SET", "skySunSet", "Sunset (or the end of evening twilight) at a site "
             "on a local date.", "sun:set_cells"),
    CellFunction(
        name="SKY.SUN.DAYLENGTH", method="skySunDaylength",
        summary="Hours of the local day with the Sun above the horizon (or above a "
        "twilight altitude): 24 in polar day, 0 in polar night.",
        args=_RISE_ARGS,
        result="hours", impl="sun:daylength_cells", model=_RISE_MODEL, fills_down="date",
    ),
    CellFunction(
        name="SKY.SUN.TRANSIT", method="skySunTransit",
        summary="Local time of the Sun's transit of the meridian (local apparent noon).",
        args=_DAY_AT_SITE,
        result="a date-time value (local)", result_kind="datetime",
        impl="sun:transit_cells", model=_RISE_MODEL, fills_down="date",
    ),
    CellFunction(
        name="SKY.SUN.ELONGATION", method="skySunElongation",
        summary="Angular distance of a direction from the Sun (elongation), as seen from "
        "the Earth's centre.",
        args=_TARGET_AT, result="degrees in [0, 180]", impl="sun:elongation_cells",
        model="Target and astrometric Sun compared on the ICRS axes. " + _SUN_MODEL,
    ),
    CellFunction(
        name="SKY.SUN.RELATIVE.LON", method="skySunRelativeLon",
        summary="Sun-centred ecliptic longitude of a target: its ecliptic longitude minus "
        "the Sun's.",
        args=_TARGET_AT, result="degrees in (-180, 180]", impl="sun:relative_lon_cells",
        model="Target and astrometric Sun on the mean ecliptic and equinox of date. " + _SUN_MODEL,
    ),
    CellFunction(
        name="SKY.SUN.RELATIVE.LAT", method="skySunRelativeLat",
        summary="Ecliptic latitude of a target on the mean ecliptic of date (the Sun's own "
        "is under 1\").",
        args=_TARGET_AT, result="degrees", impl="sun:relative_lat_cells",
        model="Mean ecliptic and equinox of date. " + _SUN_MODEL,
    ),
))
