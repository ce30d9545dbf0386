"""Minor planets and comets from their orbital elements (SKY.ORBIT.*)."""

from .. import vocabulary as vocab
from .common import (DUT1, EVENT_RESULT_SCALE, INSTANT, LATITUDE, LONGITUDE, PARALLAX_HEIGHT,
                     PLACE_KIND, PRESSURE, SCALE, SOURCE, SOURCE_NOTE, TEMPERATURE, Arg,
                     CellFunction, Family, span_text)

_ORBIT = Arg("orbit", "text",
             "The orbit, in one cell: a line of the Minor Planet Center's export format for "
             "minor planets (as in MPCORB.DAT) or for comets (as in CometEls.txt), packed "
             "designation and packed epoch included, or the ORBIT text that SKY.ORBIT.FROM.Q "
             "or SKY.ORBIT.FROM.A make from elements in cells.")
_TT = Arg("scale", "scale", "Time scale of the times given: TT (default, the scale of "
          "orbital elements) or any scale as for SKY.JD.", default="TT", choices=vocab.SCALES)
_ANGLES = (
    Arg("inclination", "number", "Inclination i to the ecliptic of J2000.0, degrees."),
    Arg("node", "number", "Longitude of the ascending node, ecliptic and equinox of "
        "J2000.0, degrees."),
    Arg("perihelion", "number", "Argument of perihelion, ecliptic and equinox of J2000.0, "
        "degrees."),
)
_E = Arg("e", "number", "Eccentricity e (0 a circle, below 1 an ellipse, 1 a parabola, "
         "above 1 a hyperbola).")

_TWO_BODY = (
    "Two-body orbit about the Sun (GM from the Gaussian constant k = 0.01720209895, as the "
    "MPC's elements use), propagated by the universal variable with the Stumpff "
    "functions, one equation for every eccentricity (ellipse, parabola, hyperbola, e = 1 "
    "+- 1e-9): agrees with SPICE prop2b within 1e-12 relative and with skyfield's two-body "
    "propagation within 0.001\" in our tests. Elements on the ecliptic of J2000 (the "
    "ICRS equator turned by 84381.448\", the MPC's and JPL's convention). Two-body, the "
    "place drifts with the age of the elements (SKY.ORBIT.AGE), for a main-belt asteroid "
    "of order arcseconds a month from the epoch, far more for a near-Earth object after "
    "a close approach. Model PLANETS integrates the orbit (Cowell's method, 8th-order "
    "Gauss-Legendre) under the Sun and Mercury to Neptune from the source (the Earth for "
    "the Earth-Moon pair; no relativity, no asteroids, no comet outgassing): Mars run as a "
    "test particle from its DE440 state came back within 0.5\" of DE440 a year later; "
    "valid where the source is (the built-in theories "
    f"{span_text(vocab.BUILTIN_YEARS)}, a kernel over its span), and a date outside it "
    "gets a message. "
)
_GEOCENTRIC = (
    "Geocentric (the Earth's centre): light time by iteration, for APPARENT the Sun's "
    "light deflection and annual aberration, the Earth and the Sun from the source. The "
    "parallax of a site is not applied (up to arcminutes for a near-Earth object). "
    + SOURCE_NOTE + " "
)
_HELIO_FRAME = Arg("frame", "choice", "J2000 (default: the ecliptic or equator and equinox "
                   "of J2000.0, the elements' own), DATE (mean of date) or TRUE (true "
                   "equinox of date).", default="J2000", choices=("J2000", "DATE", "TRUE"))
_HELIO_EQ_FRAME = Arg("frame", "choice", "J2000 (default: mean equator and equinox of "
                      "J2000.0), ICRS, DATE (mean of date) or TRUE (true equator and "
                      "equinox of date).", default="J2000",
                      choices=("J2000", "ICRS", "DATE", "TRUE"))
_EQ_FRAME = Arg("frame", "choice", "TRUE (default: true equator and equinox of date), DATE "
                "(mean of date), J2000 or ICRS (with ASTROMETRIC, the place to compare with "
                "catalogue stars).", default="TRUE", choices=("TRUE", "DATE", "J2000", "ICRS"))
_ECL_FRAME = Arg("frame", "choice", "TRUE (default: true equinox of date), DATE (mean "
                 "equinox of date) or J2000.", default="TRUE", choices=("TRUE", "DATE", "J2000"))
_EVENT = Arg("event", "choice", "OPPOSITION (default: geocentric apparent ecliptic longitude "
             "180 degrees from the Sun's), PERIHELION (passage, from the elements) or CLOSEST "
             "(closest approach to the Earth's centre).", default="OPPOSITION",
             choices=("OPPOSITION", "PERIHELION", "CLOSEST"))

_MODEL = Arg("model", "choice", "TWO BODY (default: the Sun alone, the elements "
              "propagated as they are) or PLANETS (the orbit integrated from the elements' "
              "epoch under the Sun and the planets of the source: slower, seconds for a "
              "column over months).", default="TWO BODY", choices=("TWO BODY", "PLANETS"))
_HELIO_ARGS = (_ORBIT, INSTANT, SCALE, _HELIO_FRAME, SOURCE, _MODEL)
_PLAIN_ARGS = (_ORBIT, INSTANT, SCALE, SOURCE, _MODEL)


# Seen from a site: the place as SKY.TOPO.RA and its kin give it for the planets.
_TOPOCENTRIC = (
    "Seen from the site: the site (WGS84) is added to the Earth's barycentric state and the "
    "light time, the Sun's light deflection and the aberration (annual plus diurnal) are "
    "taken from there, as SKY.TOPO.RA does for the planets; a near-Earth object's parallax "
    "can reach degrees. Altitude and azimuth through ERFA atioq (refraction only with a "
    "pressure)."
)


def _fn(name, method, summary, result, impl, args, note="", result_kind="number"):
    return CellFunction(name=name, method=method, summary=summary, args=args, result=result,
                        result_kind=result_kind, impl=impl, model=note + _TWO_BODY)


FAMILY = Family("smallbodies", "Minor planets and comets from their orbital elements", (
    CellFunction(
        name="SKY.ORBIT.FROM.Q", method="skyOrbitFromQ",
        summary="An orbit in one cell (ORBIT text) from a comet's elements in cells: time "
        "of perihelion, perihelion distance, e, i, node and argument of perihelion.",
        args=(Arg("perihelion_time", "time", "Time of perihelion passage T (as for SKY.JD; "
                  "TT unless scale says otherwise)."),
              Arg("q", "number", "Perihelion distance q in au."), _E, *_ANGLES,
              Arg("epoch", "time", "Epoch of osculation (for SKY.ORBIT.AGE). Default: the "
                  "time of perihelion.", default=None),
              _TT,
              Arg("m1", "number", "Total absolute magnitude M1. Default: none (SKY.ORBIT.MAG "
                  "then needs it in its h argument).", default=None),
              Arg("k1", "number", "Slope K1 of m = M1 + 5 log D + K1 log r. Default: 10 "
                  "(the customary value).", default=None)),
        result="text: ORBIT followed by the elements (times as TT JDs)", result_kind="text",
        impl="smallbodies:from_q_cells", model=_TWO_BODY),
    CellFunction(
        name="SKY.ORBIT.FROM.A", method="skyOrbitFromA",
        summary="An orbit in one cell (ORBIT text) from a minor planet's elements in cells: "
        "epoch, semi-major axis, e, i, node, argument of perihelion and mean anomaly.",
        args=(Arg("epoch", "time", "Epoch of osculation, the instant of the mean anomaly (as "
                  "for SKY.JD; TT unless scale says otherwise)."),
              Arg("a", "number", "Semi-major axis a in au (negative for a hyperbola)."), _E,
              *_ANGLES,
              Arg("mean_anomaly", "number", "Mean anomaly M at the epoch, degrees."),
              _TT,
              Arg("h", "number", "Absolute magnitude H. Default: none (SKY.ORBIT.MAG then "
                  "needs it in its h argument).", default=None),
              Arg("g", "number", "Slope parameter G. Default: 0.15 (the customary value).",
                  default=None)),
        result="text: ORBIT followed by the elements (times as TT JDs)", result_kind="text",
        impl="smallbodies:from_a_cells", model=_TWO_BODY),
    CellFunction(
        name="SKY.ORBIT.NAME", method="skyOrbitName",
        summary="The designation or name an orbit gives, packed designations unpacked "
        "(K07Tf8A as 2007 TA418, A0001 as 100001); a bad line shows what does not read.",
        args=(_ORBIT,), result="text", result_kind="text", impl="smallbodies:name_cells"),
    _fn("SKY.ORBIT.AGE", "skyOrbitAge", "The age of the elements: the time from their epoch "
        "of osculation to the instant (a two-body place drifts as it grows).",
        "days (negative before the epoch)", "smallbodies:age_cells", (_ORBIT, INSTANT, SCALE)),
    _fn("SKY.ORBIT.PERIOD", "skyOrbitPeriod", "Orbital period of a closed orbit.", "years "
        "(365.25 days)", "smallbodies:period_cells", (_ORBIT,)),
    _fn("SKY.ORBIT.HELIO.LON", "skyOrbitHelioLon", "Heliocentric ecliptic longitude of the "
        "body of an orbit (geometric, at the instant).", "degrees in [0, 360)",
        "smallbodies:helio_lon_cells", _HELIO_ARGS),
    _fn("SKY.ORBIT.HELIO.LAT", "skyOrbitHelioLat", "Heliocentric ecliptic latitude of the "
        "body of an orbit.", "degrees", "smallbodies:helio_lat_cells", _HELIO_ARGS),
    _fn("SKY.ORBIT.HELIO.RA", "skyOrbitHelioRa", "Heliocentric right ascension of the body "
        "of an orbit.", "degrees in [0, 360)", "smallbodies:helio_ra_cells",
        (_ORBIT, INSTANT, SCALE, _HELIO_EQ_FRAME, SOURCE, _MODEL)),
    _fn("SKY.ORBIT.HELIO.DEC", "skyOrbitHelioDec", "Heliocentric declination of the body of "
        "an orbit.", "degrees", "smallbodies:helio_dec_cells",
        (_ORBIT, INSTANT, SCALE, _HELIO_EQ_FRAME, SOURCE, _MODEL)),
    _fn("SKY.ORBIT.SUN.DIST", "skyOrbitSunDist", "Distance r of the body of an orbit from "
        "the Sun's centre (geometric, at the instant).", "astronomical units",
        "smallbodies:sun_dist_cells", (_ORBIT, INSTANT, SCALE, SOURCE, _MODEL)),
    _fn("SKY.ORBIT.RA", "skyOrbitRa", "Geocentric right ascension of the body of an orbit.",
        "degrees in [0, 360)", "smallbodies:ra_cells",
        (_ORBIT, INSTANT, SCALE, _EQ_FRAME, PLACE_KIND, SOURCE, _MODEL), _GEOCENTRIC),
    _fn("SKY.ORBIT.DEC", "skyOrbitDec", "Geocentric declination of the body of an orbit.",
        "degrees", "smallbodies:dec_cells",
        (_ORBIT, INSTANT, SCALE, _EQ_FRAME, PLACE_KIND, SOURCE, _MODEL), _GEOCENTRIC),
    _fn("SKY.ORBIT.LON", "skyOrbitLon", "Geocentric ecliptic longitude of the body of an "
        "orbit.", "degrees in [0, 360)", "smallbodies:lon_cells",
        (_ORBIT, INSTANT, SCALE, _ECL_FRAME, PLACE_KIND, SOURCE, _MODEL), _GEOCENTRIC),
    _fn("SKY.ORBIT.LAT", "skyOrbitLat", "Geocentric ecliptic latitude of the body of an "
        "orbit.", "degrees", "smallbodies:lat_cells",
        (_ORBIT, INSTANT, SCALE, _ECL_FRAME, PLACE_KIND, SOURCE, _MODEL), _GEOCENTRIC),
    _fn("SKY.ORBIT.EARTH.DIST", "skyOrbitEarthDist", "True distance (delta) of the body of "
        "an orbit from the Earth's centre: to where the light now arriving left it.",
        "astronomical units", "smallbodies:earth_dist_cells", _PLAIN_ARGS, _GEOCENTRIC),
    _fn("SKY.ORBIT.ELONGATION", "skyOrbitElongation", "Elongation: the angle between the "
        "body of an orbit and the Sun, geocentric apparent.", "degrees in [0, 180]",
        "smallbodies:elongation_cells", _PLAIN_ARGS, _GEOCENTRIC),
    _fn("SKY.ORBIT.PHASE.ANGLE", "skyOrbitPhaseAngle", "Phase angle: the angle Sun-body-"
        "Earth.", "degrees in [0, 180]", "smallbodies:phase_angle_cells", _PLAIN_ARGS,
        _GEOCENTRIC),
    _fn("SKY.ORBIT.RATE", "skyOrbitRate", "Rate of motion on the sky of the body of an orbit "
        "(geocentric astrometric), for trailing and exposure limits.",
        "arcseconds per minute", "smallbodies:rate_cells", _PLAIN_ARGS,
        "From the velocities (light time's rate included), instantaneous. " + _GEOCENTRIC),
    _fn("SKY.ORBIT.RATE.PA", "skyOrbitRatePa", "Direction of motion on the sky: the "
        "position angle of the motion, from north through east.", "degrees in [0, 360)",
        "smallbodies:direction_cells", _PLAIN_ARGS, _GEOCENTRIC),
    _fn("SKY.ORBIT.MAG", "skyOrbitMag", "Visual magnitude of a minor planet from H, G (the "
        "IAU system) or total magnitude of a comet from M1, K1.", "magnitude",
        "smallbodies:magnitude_cells",
        (_ORBIT, INSTANT, SCALE,
         Arg("h", "number", "H (or M1 for a comet) instead of the orbit's own. Default: the "
             "orbit's.", default=None),
         Arg("g", "number", "G (or K1 for a comet; G1 when g2 is given) instead of the "
             "orbit's own. Default: the orbit's, else 0.15 (G) or 10 (K1).", default=None),
         Arg("g2", "number", "G2 of the H, G1, G2 system: given, g is read as G1 and the "
             "H, G1, G2 phase functions are used (minor planets). Default: the H, G system.",
             default=None),
         SOURCE, _MODEL),
        "Minor planets: V = H + 5 log(r delta) - 2.5 log((1 - G) phi1 + G phi2) (Bowell et "
        "al. 1989, the IAU H, G system; agrees with sbpy's within 1e-6 mag), or with g2 the "
        "H, G1, G2 system (Muinonen et al. 2010: its published spline basis functions, to a "
        "phase angle of 150 degrees; agrees with sbpy's within 1e-8 mag). Comets: m = M1 + 5 log delta + K1 log r. An MPC "
        "comet line's magnitude fields are read as M1 and n, with K1 = 2.5 n (its slope "
        "field holds n; 4.0 is the customary K1 = 10). " + _GEOCENTRIC),
    _fn("SKY.ORBIT.EVENT.NEXT", "skyOrbitEventNext", "The next instant after a time of the "
        "body's opposition, perihelion passage or closest approach to the Earth.",
        "a date-time value on the result scale", "smallbodies:next_event_cells",
        (_ORBIT, Arg("time", "time", "Search from this instant on (as for SKY.JD)."), SCALE,
         _EVENT, EVENT_RESULT_SCALE, SOURCE),
        "Oppositions and closest approaches are searched over a little more than the "
        "synodic period (at most ten years) by the one event search. " + _GEOCENTRIC,
        result_kind="datetime"),
    _fn("SKY.ORBIT.TOPO.RA", "skyOrbitTopoRa", "Right ascension of the body of an orbit "
        "seen from a site.", "degrees in [0, 360)", "smallbodies:topo_ra_cells",
        (_ORBIT, INSTANT, LATITUDE, LONGITUDE, SCALE, PARALLAX_HEIGHT, _EQ_FRAME, PLACE_KIND, SOURCE,
         _MODEL, DUT1), _TOPOCENTRIC + " " + _GEOCENTRIC),
    _fn("SKY.ORBIT.TOPO.DEC", "skyOrbitTopoDec", "Declination of the body of an orbit seen "
        "from a site.", "degrees", "smallbodies:topo_dec_cells",
        (_ORBIT, INSTANT, LATITUDE, LONGITUDE, SCALE, PARALLAX_HEIGHT, _EQ_FRAME, PLACE_KIND, SOURCE,
         _MODEL, DUT1), _TOPOCENTRIC + " " + _GEOCENTRIC),
    _fn("SKY.ORBIT.TOPO.ALT", "skyOrbitTopoAlt", "Altitude of the body of an orbit at a site "
        "and time, parallax included.", "degrees in [-90, 90]", "smallbodies:topo_alt_cells",
        (_ORBIT, INSTANT, LATITUDE, LONGITUDE, SCALE, PARALLAX_HEIGHT, PRESSURE, TEMPERATURE,
         SOURCE, _MODEL, DUT1), _TOPOCENTRIC + " " + _GEOCENTRIC),
    _fn("SKY.ORBIT.TOPO.AZ", "skyOrbitTopoAz", "Azimuth of the body of an orbit at a site "
        "and time (from north through east).", "degrees in [0, 360)",
        "smallbodies:topo_az_cells",
        (_ORBIT, INSTANT, LATITUDE, LONGITUDE, SCALE, PARALLAX_HEIGHT, PRESSURE, TEMPERATURE,
         SOURCE, _MODEL, DUT1), _TOPOCENTRIC + " " + _GEOCENTRIC),
))
