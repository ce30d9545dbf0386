"""Visibility: the young Moon's first crescent (Yallop 1997, Odeh 2006) and the heliacal
rising and setting of stars and planets by the arcus visionis."""

from .. import vocabulary as vocab
from .common import DUT1, LATITUDE, LONGITUDE, SCALE, SOURCE, Arg, CellFunction, Family

_EVENING = Arg("date", "time", "The local calendar date of the evening (a date cell or date "
               "text; the time of day is ignored).")
_UTC_OFFSET = Arg("utc_offset", "real", "Hours the local clock is ahead of the date's scale "
                  "(e.g. 3 for Arabia Standard Time, -5 for EST). Default 0.", default=0.0)
_HEIGHT = Arg("height", "number", "Height of the site above the WGS84 ellipsoid in metres "
              "(for the parallax). Default 0.", default=0.0)
_QUANTITY = Arg("quantity", "choice", "AGE (hours from the nearest new Moon to the best "
                "time, negative before it), LAG (minutes from sunset to moonset, negative "
                "when the Moon sets first), ARCL (arc of light: the Moon's elongation from "
                "the Sun, degrees), ARCV (arc of vision: the Moon's airless altitude minus "
                "the Sun's, degrees), DAZ (relative azimuth: the Sun's azimuth minus the "
                "Moon's, degrees), WIDTH (the crescent's width, arcminutes) or ALTITUDE (the "
                "Moon's airless altitude, degrees). Required.",
                choices=("AGE", "LAG", "ARCL", "ARCV", "DAZ", "WIDTH", "ALTITUDE"))
_FRAME = Arg("frame", "choice", "TOPOCENTRIC (default: as seen from the site, parallax "
             "included) or GEOCENTRIC (the directions from the Earth's centre, their "
             "altitudes at the site's horizon) for ARCL, ARCV, DAZ and ALTITUDE. WIDTH is "
             "always topocentric.", default="TOPOCENTRIC",
             choices=("TOPOCENTRIC", "GEOCENTRIC"))
_EVENT = Arg("event", "choice", "BEST (Yallop's best time, sunset + 4/9 of the lag), "
             "SUNSET, MOONSET or NEW (the new Moon nearest the best time). Required.",
             choices=("BEST", "SUNSET", "MOONSET", "NEW"))
_CRITERION = Arg("criterion", "choice", "YALLOP (Yallop 1997, q) or ODEH (Odeh 2006, V). "
                 "Required.", choices=("YALLOP", "ODEH"))
_FORM = Arg("form", "choice", "LETTER (default: A to F for Yallop, A to D for Odeh) or "
            "WORDS (the letter and what the paper says it means).", default="LETTER",
            choices=("LETTER", "WORDS"))
_CRESCENT_MODEL = (
    "The evening of the local date: sunset and moonset (upper limbs at -34', "
    "topocentric, as SKY.BODY.SET; the moonset nearest the sunset), the lag between them "
    "and Yallop's best time, sunset + 4/9 of the lag (at sunset when the Moon sets "
    "first). At the best time, from the site's topocentric apparent places (as "
    "SKY.TOPO.ALT, no refraction): ARCL, ARCV (centres, airless), DAZ, and the width W = "
    "SD (1 - cos ARCL), SD the Moon's topocentric semi-diameter (1737.4 km) and ARCL "
    "topocentric. Against skyfield 1.55 + DE440 (source DE440) we measured the times "
    "within 0.1 s and the angles within 0.01\" (tests/test_visibility.py); with the "
    "built-in theories the Moon is good to about 16\". Valid "
    f"{vocab.BUILTIN_YEARS[0]:g}-{vocab.BUILTIN_YEARS[1]:g}. " + vocab.SUN_CAUTION
    + " Search for a young crescent only after the Sun has set."
)
_CRITERIA_MODEL = (
    "Yallop (1997, NAO Technical Note 69): q = (ARCV - (11.8371 - 6.3226 W + 0.7319 W^2 - "
    "0.1018 W^3)) / 10, ARCV geocentric, W topocentric (arcmin); classes A q > +0.216 "
    "easily visible, B > -0.014 visible in perfect conditions, C > -0.160 may need optical "
    "aid to find, D > -0.232 will need optical aid, E > -0.293 not visible with a "
    "telescope, F below the Danjon limit. Odeh (2006, Experimental Astronomy 18): V = "
    "ARCV - (-0.1018 W^3 + 0.7319 W^2 - 6.3226 W + 7.1651), ARCV and W topocentric; zones "
    "A V >= 5.65 visible to the naked eye, B >= 2.00 visible with optical aid (possibly "
    "by eye), C >= -0.96 optical aid only, D not visible. Coefficients and limits as we "
    "remember the papers. "
)
_EVENING_ARGS = (_EVENING, LATITUDE, LONGITUDE)
_TAIL = (SCALE, _UTC_OFFSET, _HEIGHT)


FAMILY = Family("visibility", "Visibility: the first crescent and heliacal risings", (
    CellFunction(
        name="SKY.CRESCENT", method="skyCrescent",
        summary="The young Moon on an evening at a site: its age, lag, arc of light, arc "
        "of vision, relative azimuth, crescent width or altitude at the best time.",
        args=_EVENING_ARGS + (_QUANTITY,) + _TAIL + (_FRAME, SOURCE, DUT1),
        result="hours (AGE), minutes (LAG), arcminutes (WIDTH) or degrees",
        impl="crescent:crescent_cells", model=_CRESCENT_MODEL, fills_down="date"),
    CellFunction(
        name="SKY.CRESCENT.TIME", method="skyCrescentTime",
        summary="The instants of a crescent evening: the best time to look, sunset, "
        "moonset, or the new Moon.",
        args=_EVENING_ARGS + (_EVENT,) + _TAIL + (SOURCE, DUT1),
        result="a date-time value (local: the date's scale plus utc_offset)",
        result_kind="datetime", impl="crescent:crescent_time_cells", model=_CRESCENT_MODEL,
        fills_down="date"),
    CellFunction(
        name="SKY.CRESCENT.CRITERION", method="skyCrescentCriterion",
        summary="The crescent visibility criterion's value on an evening at a site: "
        "Yallop's q or Odeh's V.",
        args=_EVENING_ARGS + (_CRITERION,) + _TAIL + (SOURCE, DUT1),
        result="q (Yallop, dimensionless) or V (Odeh, degrees)",
        impl="crescent:criterion_cells", model=_CRITERIA_MODEL + _CRESCENT_MODEL,
        fills_down="date"),
    CellFunction(
        name="SKY.CRESCENT.CLASS", method="skyCrescentClass",
        summary="The crescent's visibility class on an evening at a site by Yallop's or "
        "Odeh's criterion.",
        args=_EVENING_ARGS + (_CRITERION,) + _TAIL + (_FORM, SOURCE, DUT1),
        result="text: the class letter, or the letter and its meaning",
        result_kind="text", impl="crescent:class_cells",
        model=_CRITERIA_MODEL + _CRESCENT_MODEL, fills_down="date"),
))
