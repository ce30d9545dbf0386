"""The Moon and eclipse seasons, and the heliocentric and barycentric times of an
observation (BJD, HJD)."""

from .. import vocabulary as vocab
from .common import (EVENT_RESULT_SCALE, INSTANT, LONG_RANGE_NOTE, PLACE_FRAME, PLACE_KIND,
                     SCALE, SOURCE, SOURCE_NOTE, Arg, CellFunction, Family, angle_arg,
                     span_text)

_BUILTIN = span_text(vocab.BUILTIN_YEARS)
_MOON_MODEL = (
    "The Moon from ERFA moon98 (Meeus's ELP-2000/82 truncation: RMS 2.9\", worst 18\" "
    "and 32 km against ELP/MPP02 over 1950-2100, as ERFA states; up to 16\" (2.8\" rms) "
    f"and 12 km against DE440 in our tests; used over {_BUILTIN}); "
    "light time and annual aberration for APPARENT; geocentric (the Moon's parallax, up "
    "to 1 degree, is not applied). The Sun as SKY.SUN.LON. " + LONG_RANGE_NOTE
)
_MOON_TIME = (INSTANT, SCALE)
_WITH_SOURCE = _MOON_TIME + (SOURCE,)
_MOON_PHASE = Arg("phase", "choice", "NEW (default), FIRST (quarter), FULL or LAST (quarter).",
                  default="NEW", choices=("NEW", "FIRST", "FULL", "LAST"))
_FORM = Arg("form", "choice", "JD (default, one cell resolves about 40 us) or MJD (the same "
            f"minus {vocab.MJD_ZERO}, about 1 us).", default="JD", choices=("JD", "MJD"))
_TARGET = (angle_arg("ra", "RA of the target (ICRS, a catalogue place)"),
           angle_arg("dec", "Dec of the target (ICRS)"))
_SITE_OPTIONAL = (
    Arg("latitude", "angle", "Geodetic latitude of the site (degrees or angle text). "
        "Default none: with the longitude left out too, the Earth's centre (up to 21 ms "
        "different).", default=None),
    Arg("longitude", "angle", "Longitude of the site, EAST positive. Default none: the "
        "Earth's centre.", default=None),
    Arg("height", "number", "Height of the site above the WGS84 ellipsoid in metres. "
        "Default 0.", default=0.0),
)
_OBSTIME_OPTIONS = (_FORM,) + _SITE_OPTIONAL + (SOURCE,)
_OBSERVED = (INSTANT,) + _TARGET + (SCALE,) + _OBSTIME_OPTIONS
_HJD_SCALE = Arg("hjd_scale", "choice", "The clock of the HJD: UTC (default, HJD_UTC) or TT "
                 "(HJD_TT).", default="UTC", choices=("UTC", "TT"))
_CONVERT_OPTIONS = (_HJD_SCALE, _FORM, SOURCE)
_OBSTIME_MODEL = (
    "Geometric (Roemer) light-time delay to first order, r . n / c, with the Earth's "
    "centre from ERFA epv00 (a few km, 10 us, over 1900-2100); the Shapiro delay (under "
    "0.1 ms away from the Sun) is left out; the site's offset from the geocentre (up to "
    f"21 ms) is applied when latitude and longitude are given. Valid {_BUILTIN} (a kernel: "
    "its span). Against astropy 8.0 (with a site, built in or DE440) we measured under 3 "
    "microseconds."
)


def _moon_place(name, method, summary, result, impl):
    return CellFunction(name=name, method=method, summary=summary,
                        args=_MOON_TIME + (PLACE_FRAME, PLACE_KIND, SOURCE), result=result,
                        impl=impl, model=_MOON_MODEL + " " + SOURCE_NOTE)


FAMILY = Family("moon", "The Moon, eclipse seasons, and heliocentric and barycentric times", (
    _moon_place("SKY.MOON.LON", "skyMoonLon", "Ecliptic longitude of the Moon, geocentric.",
                "degrees in [0, 360)", "moon:lon_cells"),
    _moon_place("SKY.MOON.LAT", "skyMoonLat", "Ecliptic latitude of the Moon, geocentric.",
                "degrees", "moon:lat_cells"),
    _moon_place("SKY.MOON.RA", "skyMoonRa", "Right ascension of the Moon, geocentric.",
                "degrees in [0, 360)", "moon:ra_cells"),
    _moon_place("SKY.MOON.DEC", "skyMoonDec", "Declination of the Moon, geocentric.",
                "degrees", "moon:dec_cells"),
    CellFunction(
        name="SKY.MOON.DIST", method="skyMoonDist",
        summary="Distance of the Moon from the Earth's centre.",
        args=_MOON_TIME + (Arg("unit", "choice", "KM (default) or EARTH_RADII "
                               f"({vocab.EARTH_RADIUS_KM} km).",
                               default="KM", choices=("KM", "EARTH_RADII")), SOURCE),
        result="kilometres or Earth radii", impl="moon:distance_cells", model=_MOON_MODEL),
    CellFunction(
        name="SKY.MOON.ELONGATION", method="skyMoonElongation",
        summary="The Moon's apparent ecliptic longitude minus the Sun's: 0 at new Moon, 90 "
        "at first quarter, 180 at full, 270 at last quarter.",
        args=_WITH_SOURCE, result="degrees in [0, 360)", impl="moon:elongation_cells",
        model=_MOON_MODEL),
    CellFunction(
        name="SKY.MOON.PHASE.ANGLE", method="skyMoonPhaseAngle",
        summary="Phase angle of the Moon: the angle Sun-Moon-Earth (0 full, 180 new).",
        args=_WITH_SOURCE, result="degrees", impl="moon:phase_angle_cells",
        model=_MOON_MODEL),
    CellFunction(
        name="SKY.MOON.ILLUMINATED", method="skyMoonIlluminated",
        summary="Illuminated fraction of the Moon's disc, (1 + cos phase angle) / 2.",
        args=_WITH_SOURCE, result="fraction 0 to 1", impl="moon:illuminated_cells",
        model=_MOON_MODEL),
    CellFunction(
        name="SKY.MOON.AGE", method="skyMoonAge",
        summary="Age of the Moon: days since the last new Moon.",
        args=_MOON_TIME, result="days", impl="moon:age_cells", model=_MOON_MODEL),
    CellFunction(
        name="SKY.MOON.NODE", method="skyMoonNode",
        summary="Ecliptic longitude of the Moon's ascending node, mean ecliptic and equinox "
        "of date.",
        args=_MOON_TIME + (Arg("kind", "choice", "TRUE (default: the osculating node of the "
                               "Moon's orbit) or MEAN (Simon et al. 1994, IERS 2003, ERFA "
                               "faom03).", default="TRUE", choices=("TRUE", "MEAN")),),
        result="degrees in [0, 360)", impl="moon:node_cells", model=_MOON_MODEL),
    CellFunction(
        name="SKY.MOON.PHASE.NEXT", method="skyMoonPhaseNext",
        summary="The next instant after a time of a phase of the Moon (new, first quarter, "
        "full, last quarter).",
        args=_MOON_TIME + (_MOON_PHASE, EVENT_RESULT_SCALE, SOURCE),
        result="a date-time value on the result scale", result_kind="datetime",
        impl="moon:next_phase_cells",
        model="Found by the one event search on SKY.MOON.ELONGATION (to well under a second "
        "of the model; the model's own error moves a phase by up to about a minute; with "
        "DE440 our instants agree with skyfield's to well under a second). " + _MOON_MODEL),
    CellFunction(
        name="SKY.ECLIPSE.NODE.DISTANCE", method="skyEclipseNodeDistance",
        summary="The Sun's distance in ecliptic longitude from the nearer node of the "
        "Moon's orbit (the true node): small near an eclipse season.",
        args=_MOON_TIME, result="degrees, 0 to 90", impl="moon:node_distance_cells",
        model=_MOON_MODEL),
    CellFunction(
        name="SKY.ECLIPSE.POSSIBLE", method="skyEclipsePossible",
        summary="At a new or full Moon, whether a solar or lunar eclipse is possible by the "
        "ecliptic limits.",
        args=_MOON_TIME, result='text: "solar eclipse possible", "no solar eclipse", "lunar '
        'eclipse possible" or "no lunar eclipse"', result_kind="text",
        impl="moon:eclipse_cells",
        model="Ecliptic limits (common practice): solar when the Sun is within 18.5 degrees "
        "of a node at new Moon, lunar (umbral) within 12.2 degrees at full Moon; these are "
        "the widest limits, so 'possible' is not 'certain'. Give the phase's instant "
        "(SKY.MOON.PHASE.NEXT). " + _MOON_MODEL),
    CellFunction(
        name="SKY.BJD.TDB", method="skyBjdTdb",
        summary="Barycentric Julian Date on TDB (BJD_TDB) of an observation of a target: "
        "the time the light would have reached the solar system's barycentre.",
        args=_OBSERVED, result="BJD_TDB in days (JD or MJD form)",
        impl="obstimes:bjd_tdb_cells", model=_OBSTIME_MODEL),
    CellFunction(
        name="SKY.HJD.UTC", method="skyHjdUtc",
        summary="Heliocentric Julian Date on UTC (HJD_UTC) of an observation of a target: "
        "the time the light would have reached the Sun's centre, on the UTC clock.",
        args=_OBSERVED, result="HJD_UTC in days (JD or MJD form)",
        impl="obstimes:hjd_utc_cells",
        model="Mixing HJD_UTC with BJD_TDB costs over a minute: the names say which. "
        + _OBSTIME_MODEL),
    CellFunction(
        name="SKY.HJD.TT", method="skyHjdTt",
        summary="Heliocentric Julian Date on TT (HJD_TT) of an observation of a target.",
        args=_OBSERVED, result="HJD_TT in days (JD or MJD form)",
        impl="obstimes:hjd_tt_cells", model=_OBSTIME_MODEL),
    CellFunction(
        name="SKY.BJD.TDB.DATETIME", method="skyBjdTdbDatetime",
        summary="The UTC date-time of the observation whose BJD_TDB is given (the inverse of "
        "SKY.BJD.TDB).",
        args=(Arg("bjd", "number", "The BJD_TDB, in the form given next."),) + _TARGET
        + _OBSTIME_OPTIONS,
        result="a date-time value on UTC", result_kind="datetime",
        impl="obstimes:bjd_tdb_datetime_cells", model=_OBSTIME_MODEL),
    CellFunction(
        name="SKY.HJD.UTC.DATETIME", method="skyHjdUtcDatetime",
        summary="The UTC date-time of the observation whose HJD_UTC is given (the inverse of "
        "SKY.HJD.UTC).",
        args=(Arg("hjd", "number", "The HJD_UTC, in the form given next."),) + _TARGET
        + _OBSTIME_OPTIONS,
        result="a date-time value on UTC", result_kind="datetime",
        impl="obstimes:hjd_utc_datetime_cells", model=_OBSTIME_MODEL),
    CellFunction(
        name="SKY.HJD.TO.BJD.TDB", method="skyHjdToBjdTdb",
        summary="The BJD_TDB of the observation whose HJD (on UTC or TT) is given, for a "
        "target.",
        args=(Arg("hjd", "number", "The HJD, in the form given by form."),) + _TARGET
        + _CONVERT_OPTIONS,
        result="BJD_TDB in days (JD or MJD form)", impl="obstimes:hjd_to_bjd_cells",
        model="The HJD is undone to the geocentric instant, then corrected to the "
        "barycentre (the site's term is common to both and cancels). " + _OBSTIME_MODEL),
    CellFunction(
        name="SKY.BJD.TDB.TO.HJD", method="skyBjdTdbToHjd",
        summary="The HJD (on UTC or TT) of the observation whose BJD_TDB is given, for a "
        "target.",
        args=(Arg("bjd", "number", "The BJD_TDB, in the form given by form."),) + _TARGET
        + _CONVERT_OPTIONS,
        result="HJD in days (JD or MJD form) on the hjd_scale",
        impl="obstimes:bjd_to_hjd_cells",
        model="The inverse of SKY.HJD.TO.BJD.TDB. " + _OBSTIME_MODEL),
))
