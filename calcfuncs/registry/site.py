"""A night at a site: topocentric places, rising, transit and setting of anything, and
observing windows."""

from .. import vocabulary as vocab
from .common import (DUT1, LATITUDE, LONGITUDE, PARALLAX_HEIGHT, PRESSURE, SCALE, SOURCE,
                     TEMPERATURE, Arg, CellFunction, Family, angle_arg, span_text, words)

_BODIES = ("SUN", "MOON") + vocab.PLANETS
_BODY = Arg("body", "choice", f"The body: {words(_BODIES)} (Pluto only from a JPL kernel).",
            choices=_BODIES)
_TOPO_FRAME = Arg("frame", "choice", "TRUE (default: true equator and equinox of date, as "
                  "almanacs give apparent places), DATE (mean of date), J2000 or ICRS.",
                  default="TRUE", choices=("TRUE", "DATE", "J2000", "ICRS"))
_TOPO_KIND = Arg("kind", "choice", "APPARENT (default: light time, light deflection, annual "
                 "and diurnal aberration), ASTROMETRIC (light time only) or GEOMETRIC "
                 "(neither).", default="APPARENT", choices=vocab.KINDS)
_AT = Arg("time", "time", "The instant of the observation (as for SKY.JD).")
_TOPO_MODEL = (
    "Topocentric: the site (WGS84, ERFA pvtob turned to the GCRS as ERFA apco does) is added "
    "to the Earth's barycentric state, and the body's light time, the Sun's light "
    "deflection (ERFA ld) and the aberration (ERFA ab, annual plus diurnal) are taken from "
    "the site itself, so the Moon's parallax (up to 1 degree) and the planets' (up to 30\") "
    "are in the place. Against skyfield 1.55 with DE440 (source DE440) we measured within "
    "0.001\". Bodies: the Sun and the planets as SKY.PLANET.RA (ERFA epv00 and plan94 "
    "built in), the Moon as SKY.MOON.RA (ERFA moon98, 16\" worst against DE440). Polar "
    f"motion taken as zero. Valid {span_text(vocab.IAU2006_YEARS)}. " + vocab.SUN_CAUTION
)
_ALTAZ_MODEL = (
    "Altitude and azimuth: the topocentric apparent place turned to CIRS and ERFA atioq, as "
    "SKY.HORIZON.ALT does for catalogue places (refraction: ERFA refco, only with a "
    "pressure, and only above 5 degrees). Azimuth from north through east. DUT1 default 0 "
    "(up to 0.9 s, 14\" in hour angle). " + _TOPO_MODEL
)

_LOCAL_DATE = Arg("date", "time", "The local calendar date (a date cell or date text; the "
                  "time of day is ignored).")
_UTC_OFFSET = Arg("utc_offset", "real", "Hours the local clock is ahead of the date's scale "
                  "(e.g. 1 for CET, -5 for EST). Default 0.", default=0.0)
_HORIZON_HEIGHT = Arg("horizon_height", "number", "Height of the observer above the "
                      "surrounding ground or sea in metres: lowers the horizon by the dip, "
                      "1.76' per sqrt(m). Default 0.", default=0.0)
_LIMB = Arg("limb", "choice", "UPPER (default: the upper limb of the Sun or the Moon on the "
            "horizon, semi-diameter from the distance) or CENTRE. Planets and stars are "
            "points.", default="UPPER", choices=("UPPER", "CENTRE"))
_RISE_PRESSURE = Arg("pressure", "real", "Air pressure in hPa: the refraction at the horizon "
                     "is 34' x (P/1010) x (283/(273+T)); 0 for none. Default: the standard "
                     "34'.", default=None)
_MERIDIAN = Arg("meridian", "choice", "UPPER (default: the transit, highest) or LOWER (the "
                "lower culmination, below the pole).", default="UPPER",
                choices=("UPPER", "LOWER"))
_STAR = (angle_arg("ra", "RA of the star (ICRS, a catalogue place at the epoch)"),
         angle_arg("dec", "Dec of the star (ICRS)"))
_PROPER_MOTION = (
    Arg("pm_ra", "number", "Proper motion in RA, mu_alpha* = mu_alpha cos Dec, in mas a year "
        "(as Hipparcos and Gaia give it). Default 0.", default=0.0),
    Arg("pm_dec", "number", "Proper motion in Dec in mas a year. Default 0.", default=0.0),
    Arg("epoch", "number", "The epoch of the RA and Dec (a Julian year such as 2000 or 2016). "
        "Default 2000.", default=2000.0),
)
_RISE_MODEL = (
    "Searched over the local date on the topocentric altitude of the centre (parallax "
    "included, so the Moon's is in the altitude itself), to well under a second. The "
    "event: the centre at -(refraction + dip + semi-diameter for UPPER); refraction 34' "
    "(common practice) unless a pressure is given. The Moon's semi-diameter from its "
    "distance from the site (radius 1737.4 km). Against skyfield 1.55 + DE440 "
    "(find_risings, find_settings, find_transits, same conventions) at nine latitudes "
    "from -70 to 78 over a year we measured within 1 s (the Moon, the planets, the Sun, "
    "stars, source DE440) away from grazing events; with the built-in theories the "
    "Moon's and the planets' own errors (16\" and up to 66\" for Jupiter) moved the "
    "times by up to 2 s at mid-latitudes and 15 s near 70 degrees. A date without the event says so in words (a Moon "
    "that rises on the next date, a star that never rises or never sets). Results on the "
    "date's scale plus utc_offset; format the cell as a time."
)
_DAY_AT_SITE = (_LOCAL_DATE, LATITUDE, LONGITUDE, SCALE, _UTC_OFFSET)
_BODY_RISE_ARGS = ((_BODY,) + _DAY_AT_SITE + (PARALLAX_HEIGHT, _HORIZON_HEIGHT, _LIMB,
                                              _RISE_PRESSURE, TEMPERATURE, SOURCE))
_BODY_TRANSIT_ARGS = (_BODY,) + _DAY_AT_SITE + (_MERIDIAN, PARALLAX_HEIGHT, SOURCE)
_STAR_RISE_ARGS = (_STAR + _DAY_AT_SITE + (_HORIZON_HEIGHT, _RISE_PRESSURE, TEMPERATURE)
                   + _PROPER_MOTION)
_STAR_TRANSIT_ARGS = _STAR + _DAY_AT_SITE + (_MERIDIAN,) + _PROPER_MOTION
_STAR_NOTE = ("The star's place from ERFA atciq (proper motion from its epoch, light "
              "deflection, annual aberration; parallax and radial velocity left out). ")

_LIMIT = Arg("limit", "number", "The altitude limit in degrees (default 30), or with "
             "limit_kind AIRMASS the air mass limit (e.g. 2).", default=30.0)
_LIMIT_KIND = Arg("limit_kind", "choice", "ALTITUDE (default) or AIRMASS (Kasten and Young "
                  "1989).", default="ALTITUDE", choices=("ALTITUDE", "AIRMASS"))
_TWILIGHT = Arg("twilight", "choice", "How dark: ASTRONOMICAL (default: the Sun's centre "
                "below -18 degrees), NAUTICAL (-12) or CIVIL (-6).",
                default="ASTRONOMICAL", choices=("ASTRONOMICAL", "NAUTICAL", "CIVIL"))
_WINDOW_ARGS = (_STAR + _DAY_AT_SITE + (_LIMIT, _LIMIT_KIND, _TWILIGHT, PARALLAX_HEIGHT)
                + _PROPER_MOTION)
_WINDOW_MODEL = (
    "The night of a local date runs from its local noon to the next. The window: the "
    "longest stretch of that night with the Sun's centre below the twilight and the "
    "target's altitude (refracted, Saemundsson 1986) above the limit; when the target is "
    "not high while it is dark, the cell says so. Topocentric altitudes as SKY.STAR.RISE "
    "and SKY.BODY.RISE, built-in theories. Results on the date's scale plus utc_offset."
)
_MOON_QUANTITY = Arg("quantity", "choice", "SEPARATION (default: the Moon's topocentric "
                     "angular distance from the target, degrees), ALTITUDE (the Moon's "
                     "topocentric altitude, unrefracted, degrees) or ILLUMINATED (the "
                     "fraction of its disc lit, 0 to 1).", default="SEPARATION",
                     choices=("SEPARATION", "ALTITUDE", "ILLUMINATED"))
_DARK_ARGS = _DAY_AT_SITE + (_TWILIGHT, PARALLAX_HEIGHT)
_DARK_MODEL = (
    "The night of a local date runs from its local noon to the next. Moon-free dark time: "
    "the Sun's centre below the twilight and the Moon's upper limb below the horizon (34' "
    "refraction, semi-diameter from the site), topocentric, built-in theories. Start and "
    "end are those of the longest such stretch; the hours are the total of the night."
)


def _event(name, method, summary, args, impl, model):
    return CellFunction(name=name, method=method, summary=summary, args=args,
                        result="a date-time value (local), or a text when it does not happen",
                        result_kind="datetime", impl=impl, model=model, fills_down="date")


FAMILY = Family("site", "A night at a site: topocentric places, rising and setting, "
                "observing windows", (
    CellFunction(
        name="SKY.TOPO.RA", method="skyTopoRa",
        summary="Right ascension of the Sun, the Moon or a planet as seen from a site "
        "(topocentric).",
        args=(_BODY, _AT, LATITUDE, LONGITUDE, SCALE, PARALLAX_HEIGHT, _TOPO_FRAME, _TOPO_KIND,
              SOURCE, DUT1),
        result="degrees in [0, 360)", impl="topocentric:ra_cells", model=_TOPO_MODEL),
    CellFunction(
        name="SKY.TOPO.DEC", method="skyTopoDec",
        summary="Declination of the Sun, the Moon or a planet as seen from a site "
        "(topocentric).",
        args=(_BODY, _AT, LATITUDE, LONGITUDE, SCALE, PARALLAX_HEIGHT, _TOPO_FRAME, _TOPO_KIND,
              SOURCE, DUT1),
        result="degrees", impl="topocentric:dec_cells", model=_TOPO_MODEL),
    CellFunction(
        name="SKY.TOPO.DIST", method="skyTopoDist",
        summary="Distance of the Sun, the Moon or a planet from a site (geometric).",
        args=(_BODY, _AT, LATITUDE, LONGITUDE, SCALE, PARALLAX_HEIGHT,
              Arg("unit", "choice", "AU (default) or KM.", default="AU", choices=("AU", "KM")),
              SOURCE, DUT1),
        result="astronomical units or kilometres", impl="topocentric:distance_cells",
        model=_TOPO_MODEL),
    CellFunction(
        name="SKY.TOPO.ALT", method="skyTopoAlt",
        summary="Altitude of the Sun, the Moon or a planet at a site and time, parallax "
        "included.",
        args=(_BODY, _AT, LATITUDE, LONGITUDE, SCALE, PARALLAX_HEIGHT, PRESSURE, TEMPERATURE,
              SOURCE, DUT1),
        result="degrees in [-90, 90] (refracted when a pressure is given)",
        impl="topocentric:altitude_cells", model=_ALTAZ_MODEL),
    CellFunction(
        name="SKY.TOPO.AZ", method="skyTopoAz",
        summary="Azimuth of the Sun, the Moon or a planet at a site and time, from north "
        "through east.",
        args=(_BODY, _AT, LATITUDE, LONGITUDE, SCALE, PARALLAX_HEIGHT, PRESSURE, TEMPERATURE,
              SOURCE, DUT1),
        result="degrees in [0, 360), north 0, east 90", impl="topocentric:azimuth_cells",
        model=_ALTAZ_MODEL),
    CellFunction(
        name="SKY.MOON.SEMIDIAMETER", method="skyMoonSemidiameter",
        summary="The Moon's apparent semi-diameter, from a site (when given) or from the "
        "Earth's centre.",
        args=(_AT, SCALE,
              Arg("latitude", "angle", "Geodetic latitude of the site. Default none: the "
                  "Earth's centre.", default=None),
              Arg("longitude", "angle", "East longitude of the site. Default none: the "
                  "Earth's centre.", default=None),
              PARALLAX_HEIGHT, SOURCE, DUT1),
        result="arcminutes", impl="topocentric:moon_semidiameter_cells",
        model="asin(1737.4 km / distance), the distance from the site or the Earth's centre "
        "(the Moon's radius: IAU mean). From a site the Moon looks up to 1.8 % larger "
        "overhead than at the horizon. " + _TOPO_MODEL),
    CellFunction(
        name="SKY.MOON.PARALLAX", method="skyMoonParallax",
        summary="The Moon's equatorial horizontal parallax.",
        args=(_AT, SCALE, SOURCE), result="arcminutes (about 54 to 61)",
        impl="topocentric:moon_parallax_cells",
        model=f"asin({vocab.EARTH_RADIUS_KM} km / geocentric distance), the Moon as "
        "SKY.MOON.DIST."),
    _event("SKY.BODY.RISE", "skyBodyRise", "Rising of the Moon, a planet or the Sun at a "
           "site on a local date (topocentric).", _BODY_RISE_ARGS, "risings:body_rise_cells",
           _RISE_MODEL + " " + vocab.SUN_CAUTION),
    _event("SKY.BODY.SET", "skyBodySet", "Setting of the Moon, a planet or the Sun at a site "
           "on a local date (topocentric).", _BODY_RISE_ARGS, "risings:body_set_cells",
           _RISE_MODEL + " " + vocab.SUN_CAUTION),
    _event("SKY.BODY.TRANSIT", "skyBodyTransit", "Transit of the meridian (or lower "
           "culmination) of the Moon, a planet or the Sun at a site on a local date.",
           _BODY_TRANSIT_ARGS, "risings:body_transit_cells",
           "The topocentric hour angle reaching 0 (180 for LOWER). " + _RISE_MODEL),
    _event("SKY.STAR.RISE", "skyStarRise", "Rising of a star (any RA/Dec) at a site on a "
           "local date.", _STAR_RISE_ARGS, "risings:star_rise_cells", _STAR_NOTE + _RISE_MODEL),
    _event("SKY.STAR.SET", "skyStarSet", "Setting of a star (any RA/Dec) at a site on a "
           "local date.", _STAR_RISE_ARGS, "risings:star_set_cells", _STAR_NOTE + _RISE_MODEL),
    _event("SKY.STAR.TRANSIT", "skyStarTransit", "Transit of the meridian (or lower "
           "culmination) of a star at a site on a local date.", _STAR_TRANSIT_ARGS,
           "risings:star_transit_cells", _STAR_NOTE + _RISE_MODEL),
    _event("SKY.WINDOW.START", "skyWindowStart", "Start of a target's observing window on "
           "a night: above the altitude (or air mass) limit while the sky is dark.",
           _WINDOW_ARGS, "windows:window_start_cells", _WINDOW_MODEL),
    _event("SKY.WINDOW.END", "skyWindowEnd", "End of a target's observing window on a "
           "night.", _WINDOW_ARGS, "windows:window_end_cells", _WINDOW_MODEL),
    CellFunction(
        name="SKY.WINDOW.HOURS", method="skyWindowHours",
        summary="Hours of a night that a target spends above the limit while the sky is "
        "dark.", args=_WINDOW_ARGS, result="hours (0 when never)",
        impl="windows:window_hours_cells", model=_WINDOW_MODEL, fills_down="date"),
    _event("SKY.WINDOW.BEST", "skyWindowBest", "The best moment of a target's window: its "
           "highest while the sky is dark.", _WINDOW_ARGS, "windows:window_best_cells",
           _WINDOW_MODEL),
    CellFunction(
        name="SKY.WINDOW.MOON", method="skyWindowMoon",
        summary="The Moon at a target's best moment of a night: its separation from the "
        "target, its altitude or its illuminated fraction.",
        args=_STAR + _DAY_AT_SITE + (_MOON_QUANTITY, _LIMIT, _LIMIT_KIND, _TWILIGHT,
                                     PARALLAX_HEIGHT),
        result="degrees, or a fraction 0 to 1", impl="windows:window_moon_cells",
        model="The Moon topocentric (as SKY.TOPO.ALT, astrometric against the catalogue "
        "place for the separation). " + _WINDOW_MODEL, fills_down="date"),
    CellFunction(
        name="SKY.MOON.SEPARATION", method="skyMoonSeparation",
        summary="Angular distance of a target from the Moon as seen from a site "
        "(topocentric).",
        args=(angle_arg("ra", "RA of the target (ICRS)"), angle_arg("dec", "Dec of the "
              "target (ICRS)"), _AT, LATITUDE, LONGITUDE, SCALE, PARALLAX_HEIGHT, SOURCE, DUT1),
        result="degrees in [0, 180]", impl="windows:moon_separation_cells",
        model="The Moon's topocentric astrometric place against the catalogue direction, "
        "both on the ICRS axes (up to 1 degree from the geocentric separation). "
        + _TOPO_MODEL),
    _event("SKY.DARK.START", "skyDarkStart", "Start of the Moon-free dark time of a night "
           "at a site.", _DARK_ARGS, "windows:dark_start_cells", _DARK_MODEL),
    _event("SKY.DARK.END", "skyDarkEnd", "End of the Moon-free dark time of a night at a "
           "site.", _DARK_ARGS, "windows:dark_end_cells", _DARK_MODEL),
    CellFunction(
        name="SKY.DARK.HOURS", method="skyDarkHours",
        summary="Hours of a night with the sky dark and the Moon down (meteor observers' "
        "effective time).", args=_DARK_ARGS, result="hours",
        impl="windows:dark_hours_cells", model=_DARK_MODEL, fills_down="date"),
))
