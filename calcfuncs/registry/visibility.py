"""Visibility: the young Moon's first crescent (Yallop 1997, Odeh 2006) and the heliacal
rising and setting of stars and planets by the arcus visionis."""

from .. import vocabulary as vocab
from .common import (DUT1, LATITUDE, LONGITUDE, SCALE, SOURCE, Arg, CellFunction, Family,
                     angle_arg)

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
    "topocentric. Against skyfield 1.55 + DE440 (source DE440) we measured sunset and "
    "moonset within 0.03 s and the angles within 0.001\" (tests/test_visibility.py); "
    "with the built-in theories (the Moon good to about 16\") within 0.4 s and 5\". Valid "
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

_MAGNITUDE = Arg("magnitude", "number", "The star's visual magnitude (e.g. -1.46 for "
                 "Sirius); 5 at most.")
_FROM_DATE = Arg("date", "time", "The local date to search from: the first event on or "
                 "after it is given (within 400 days for a star, 800 for a planet). For "
                 'antiquity give text such as "-1313-06-01" with scale UT (Julian calendar '
                 "before 1582).")
_HELIACAL_EVENT = Arg("event", "choice", "RISING (the first morning the target is seen "
                      "in the dawn) or SETTING (the last evening it is seen in the dusk). "
                      "Required.", choices=("RISING", "SETTING"))
_PLANET = Arg("body", "choice", "The planet: MERCURY, VENUS, MARS, JUPITER or SATURN.",
              choices=("MERCURY", "VENUS", "MARS", "JUPITER", "SATURN"))
_ARCUS = Arg("arcus_visionis", "number", "Your own arcus visionis in degrees (1 to 25). "
             "Default: from the magnitude for a star (SKY.ARCUS.VISIONIS), Ptolemy's "
             "value for a planet.", default=None)
_PROPER_MOTION = (
    Arg("pm_ra", "number", "Proper motion in RA, mu_alpha* = mu_alpha cos Dec, in mas a "
        "year (as Hipparcos and Gaia give it; Sirius -546). Default 0.", default=0.0),
    Arg("pm_dec", "number", "Proper motion in Dec in mas a year (Sirius -1223). Default 0.",
        default=0.0),
    Arg("epoch", "number", "The epoch of the RA and Dec, a year. Default 2000.",
        default=2000.0),
)
_ARCUS_TABLE = (
    "Linear in the magnitude between the values -1.5: 10.0, 0: 10.5, 1: 11.0, 2: 12.5, 3: "
    "14.0, 4: 15.0, 5: 16.0 degrees (brighter than -1.5: 10.0): rounded values of the "
    "classical tables (after Schoch), as we remember them. Planets (Ptolemy, from "
    "memory): Mercury 10, Venus 5, Mars 11.5, Jupiter 10, Saturn 11. The published values "
    "scatter by a degree or two; each degree moves a heliacal date by about a day."
)
_HELIACAL_MODEL = (
    "The classical criterion: seen when, at the target's apparent rising (setting: its "
    "true altitude -34'), the Sun's centre is at least the arcus visionis below the "
    "horizon (true altitude). Heliacal rising: the first such morning; setting: the last "
    "such evening. " + _ARCUS_TABLE + " Places from the built-in theories (VSOP87D and "
    "Vondrak et al. 2011 outside 1000-3000), a star moved along its proper motion, "
    "annual aberration (20\") and the site's parallax left out. Valid -4000 to +8000 for "
    "the geometry; the date is as good as the arcus visionis (a day or two; haze more). "
    "For Sirius at Memphis our dates fall on 18 to 20 July (Julian) from 1450 BC to AD "
    "139, the dates of the Sothic literature within a day or two (tests/"
    "test_visibility.py). Result on the date's scale plus utc_offset (for antiquity "
    "scale UT and e.g. longitude/15 hours for local mean time). " + vocab.SUN_CAUTION
)
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
    CellFunction(
        name="SKY.HELIACAL.STAR", method="skyHeliacalStar",
        summary="The heliacal rising (first morning seen) or setting (last evening seen) "
        "of a star at a site, by the arcus visionis: the first such event from a date.",
        args=(angle_arg("ra", "RA of the star (ICRS, the catalogue place at its epoch)"),
              angle_arg("dec", "Dec of the star (ICRS)"), _MAGNITUDE, _FROM_DATE, LATITUDE,
              LONGITUDE, _HELIACAL_EVENT, SCALE, _UTC_OFFSET, _ARCUS) + _PROPER_MOTION,
        result="a date-time value: the star's rising (setting) on that morning (evening), "
        "local; or words when there is none", result_kind="datetime",
        impl="heliacal:star_cells", model=_HELIACAL_MODEL, fills_down="date"),
    CellFunction(
        name="SKY.HELIACAL.PLANET", method="skyHeliacalPlanet",
        summary="The heliacal rising or setting of a naked-eye planet at a site, by "
        "Ptolemy's arcus visionis: the first such event from a date.",
        args=(_PLANET, _FROM_DATE, LATITUDE, LONGITUDE, _HELIACAL_EVENT, SCALE, _UTC_OFFSET,
              _ARCUS),
        result="a date-time value: the planet's rising (setting) on that morning (evening), "
        "local; or words when there is none", result_kind="datetime",
        impl="heliacal:planet_cells", model=_HELIACAL_MODEL, fills_down="date"),
    CellFunction(
        name="SKY.ARCUS.VISIONIS", method="skyArcusVisionis",
        summary="The arcus visionis of a star of a visual magnitude: how far the Sun must "
        "be below the horizon for it to be seen rising or setting.",
        args=(_MAGNITUDE,), result="degrees of the Sun's depression",
        impl="heliacal:arcus_cells", model=_ARCUS_TABLE),
))
