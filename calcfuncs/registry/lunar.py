"""Lunar eclipses: the next one after a date, its circumstances, and how a site sees it."""

from .. import vocabulary as vocab
from .common import (EVENT_RESULT_SCALE, LATITUDE, LONG_RANGE_NOTE, LONGITUDE, SCALE,
                     SOURCE, Arg, CellFunction, Family, span_text)

_START = Arg("time", "time", "The instant to search from (as for SKY.JD): the next lunar "
             "eclipse is the first whose greatest eclipse comes after it.")
_RULE = Arg("rule", "choice", "How the Earth's atmosphere widens the shadow: DANJON (default; "
            "Danjon 1951, as modern canons use: the Earth's radius grown by 1/85, shadow "
            "radii 1.01 pi_M + pi_S -+ s_S) or CHAUVENET (Chauvenet 1891: both shadow radii "
            "grown by 1/50, 1.02 (0.998340 pi_M + pi_S -+ s_S); umbral magnitudes about "
            "0.005 and penumbral 0.026 larger).", default="DANJON", choices=("DANJON", "CHAUVENET"),
            noun="shadow rule")
_EVENT = Arg("event", "choice", "GREATEST (default: the least distance of the Moon's centre "
             "from the shadow's axis) or a contact: P1 (penumbra touches the Moon), U1 "
             "(umbra touches), U2 (Moon wholly in the umbra), U3, U4, P4 (their ends).",
             default="GREATEST", choices=("GREATEST", "P1", "U1", "U2", "U3", "U4", "P4"))
_SHADOW = Arg("shadow", "choice", "UMBRAL (default) or PENUMBRAL: which shadow's magnitude.",
              default="UMBRAL", choices=("UMBRAL", "PENUMBRAL"))
_PHASE = Arg("phase", "choice", "TOTAL (default: U2 to U3), PARTIAL (U1 to U4, the umbral "
             "phase with the total one inside it, as canons count it) or PENUMBRAL (P1 to "
             "P4).", default="TOTAL", choices=("TOTAL", "PARTIAL", "PENUMBRAL"))
_HEIGHT = Arg("height", "number", "Height of the site above the WGS84 ellipsoid in metres. "
              "Default 0.", default=0.0)
_SIGMAS = Arg("delta_t_sigmas", "number", "Delta T moved by this many published standard "
              "errors (SKY.DELTAT.UNCERTAINTY: 1000 BC to AD 1200, 1700, 1800, 1900), -5 to "
              "5. Default 0.", default=0.0)
_SIGMA_RANGE = Arg("delta_t_sigmas", "number", "Judge the visibility over Delta T from -k to "
                   "+k published standard errors (SKY.DELTAT.UNCERTAINTY), k from 0 to 5. "
                   "Default 0: the scale's Delta T only.", default=0.0)
_TAIL = (_RULE, SOURCE)

_MODEL = (
    "The shadow's axis opposite the apparent Sun, the Moon's geometric geocentric place at "
    "the same instant; umbra and penumbra radii from the Moon's and the Sun's equatorial "
    "horizontal parallaxes and the Sun's semi-diameter (959.63\" at 1 au) by the chosen "
    "rule; the Moon's semi-diameter asin(0.2725076 sin pi_M). Instants as seen from the "
    "Earth's centre (the Moon's light time, about 1.3 s, added). Greatest eclipse and "
    "contacts from the one event search. Against the Five Millennium Canon (Espenak and "
    "Meeus) for 2021-05-26 and 2022-11-08 within 4 s and 0.0002 in umbral magnitude; "
    "against skyfield 1.55 with DE440 (Danjon) over 1900-2100 every eclipse found, of the "
    "same kind (see README for the measured spread). "
    f"Valid {span_text(vocab.LONG_RANGE_YEARS)} with the built-in source. "
    + LONG_RANGE_NOTE
)
_SITE_MODEL = (
    "The Moon's centre's topocentric altitude without refraction (as SKY.TOPO.ALT with no "
    "pressure). Far from the present Delta T dominates: each second of it turns the Earth "
    "by 0.0042 degrees, so a larger Delta T is the same as a site further west; the "
    "scale's Delta T (UT with a model or a value in seconds) is used. " + _MODEL
)

FAMILY = Family("lunar", "Lunar eclipses", (
    CellFunction(
        name="SKY.LUNAR.ECLIPSE.NEXT", method="skyLunarEclipseNext",
        summary="The instant of greatest eclipse, or of a contact (P1, U1, U2, U3, U4, P4), "
        "of the next lunar eclipse after a time. A contact the eclipse lacks (U2 of a "
        "partial one) gives a message.",
        args=(_START, SCALE, _EVENT, EVENT_RESULT_SCALE) + _TAIL,
        result="a date-time value on the result scale", result_kind="datetime",
        impl="lunar_eclipses:next_cells", model=_MODEL, fills_down="time"),
    CellFunction(
        name="SKY.LUNAR.ECLIPSE.KIND", method="skyLunarEclipseKind",
        summary="The kind of the next lunar eclipse after a time.",
        args=(_START, SCALE) + _TAIL,
        result='text: "penumbral", "partial" or "total"', result_kind="text",
        impl="lunar_eclipses:kind_cells", model=_MODEL, fills_down="time"),
    CellFunction(
        name="SKY.LUNAR.ECLIPSE.MAGNITUDE", method="skyLunarEclipseMagnitude",
        summary="The umbral or penumbral magnitude of the next lunar eclipse after a time: the "
        "fraction of the Moon's diameter inside that shadow at greatest eclipse (over 1: "
        "wholly inside; below 0 for the umbra of a penumbral eclipse).",
        args=(_START, SCALE, _SHADOW) + _TAIL, result="magnitude (a fraction of the diameter)",
        impl="lunar_eclipses:magnitude_cells", model=_MODEL, fills_down="time"),
    CellFunction(
        name="SKY.LUNAR.ECLIPSE.GAMMA", method="skyLunarEclipseGamma",
        summary="Gamma of the next lunar eclipse after a time: the least distance of the "
        "Moon's centre from the shadow's axis, in Earth equatorial radii, positive when "
        "the Moon passes north of it.",
        args=(_START, SCALE) + _TAIL, result="Earth equatorial radii",
        impl="lunar_eclipses:gamma_cells", model=_MODEL, fills_down="time"),
    CellFunction(
        name="SKY.LUNAR.ECLIPSE.DURATION", method="skyLunarEclipseDuration",
        summary="How long a phase of the next lunar eclipse after a time lasts. A phase the "
        "eclipse lacks gives a message.",
        args=(_START, SCALE, _PHASE) + _TAIL, result="minutes",
        impl="lunar_eclipses:duration_cells", model=_MODEL, fills_down="time"),
    CellFunction(
        name="SKY.LUNAR.ECLIPSE.MOON.ALT", method="skyLunarEclipseMoonAlt",
        summary="The Moon's altitude at a site at greatest eclipse or at a contact of the "
        "next lunar eclipse after a time, optionally with Delta T moved by some published "
        "standard errors.",
        args=(_START, LATITUDE, LONGITUDE, SCALE, _EVENT, _HEIGHT, _SIGMAS) + _TAIL,
        result="degrees (the Moon's centre, no refraction)",
        impl="lunar_eclipses:moon_altitude_cells", model=_SITE_MODEL, fills_down="time"),
    CellFunction(
        name="SKY.LUNAR.ECLIPSE.VISIBILITY", method="skyLunarEclipseVisibility",
        summary="Which phases of the next lunar eclipse after a time a site sees with the "
        "Moon above its horizon, in words: for each phase (total, partial, penumbral) "
        "all seen, part seen or not seen; over a Delta T range, every outcome it allows.",
        args=(_START, LATITUDE, LONGITUDE, SCALE, _HEIGHT, _SIGMA_RANGE) + _TAIL,
        result='text such as "total phase: all seen; partial phase: all seen; penumbral '
        'phase: part seen"', result_kind="text",
        impl="lunar_eclipses:visibility_cells",
        model="Above the horizon: the Moon's upper limb risen, with the standard 34' of "
        "refraction, judged at 24 instants through each phase; the sky's brightness is "
        "not judged. " + _SITE_MODEL, fills_down="time"),
))
