"""The planets, and the ephemeris sources."""

from .. import vocabulary as vocab
from .common import (EVENT_RESULT_SCALE, INSTANT, LONG_RANGE_NOTE, PLACE_FRAME, PLACE_KIND,
                     SCALE, SOURCE, SOURCE_NOTE, Arg, CellFunction, Family, span_text, words)

_PLANET_MODEL = (
    "BUILTIN: ERFA plan94 (Simon et al. 1994): heliocentric longitude against DE440 over "
    "1900-2050 within 6\" Mercury, 6\" Venus, 24\" Mars, 66\" Jupiter, 87\" Saturn, "
    "86\" Uranus, 10\" Neptune in our tests (ERFA states similar maxima against DE200); "
    f"used over {span_text(vocab.BUILTIN_YEARS)}; no Pluto; the "
    "Earth from ERFA epv00. " + LONG_RANGE_NOTE + " " + SOURCE_NOTE + " DE440 holds "
    "Mars to Pluto only as system barycentres (for Mars 0.0003\", for Jupiter up to 0.2\" "
    "from the planet's centre)."
)
_GEOCENTRIC_NOTE = (
    "Geocentric: light time by iteration, for APPARENT the Sun's light deflection (ERFA ld) "
    "and annual aberration (ERFA ab); the parallax of a site (up to 30\" for Venus at "
    "inferior conjunction, 23\" for Mars at opposition) is not applied. "
)
_BODY = Arg("body", "choice", f"The planet: {words(vocab.PLANETS)} (Pluto only from a JPL "
            "kernel).", choices=vocab.PLANETS)
_HELIO_FRAME = Arg("frame", "choice", "DATE (default: the mean ecliptic and equinox of "
                   "date, as almanacs print heliocentric places), J2000 or TRUE (true "
                   "equinox of date).", default="DATE", choices=("DATE", "J2000", "TRUE"))
_PLANET_EVENT = Arg("event", "choice", "OPPOSITION (default), CONJUNCTION (for Mercury and "
                    "Venus either kind), INFERIOR or SUPERIOR (conjunction), GREATEST EAST "
                    "or GREATEST WEST (greatest elongation, evening or morning sky); the last "
                    "four for Mercury and Venus only.", default="OPPOSITION",
                    choices=("OPPOSITION", "CONJUNCTION", "INFERIOR", "SUPERIOR",
                             "GREATEST EAST", "GREATEST WEST"))
_EQUATORIAL_FRAME = Arg("frame", "choice", "TRUE (default: true equator and equinox of "
                        "date, as almanacs give apparent places), DATE (mean of date), J2000 "
                        "(mean equator and equinox of J2000.0) or ICRS (the axes of star "
                        "catalogues, 0.02\" from J2000; with ASTROMETRIC, the place to compare "
                        "with catalogue stars).", default="TRUE",
                        choices=("TRUE", "DATE", "J2000", "ICRS"))

_HELIO_ARGS = (_BODY, INSTANT, SCALE, _HELIO_FRAME, SOURCE)
_HELIO_NOTE = "Geometric heliocentric place at the instant (no light time), as almanacs give it. "
_GEO_ARGS = (_BODY, INSTANT, SCALE, PLACE_FRAME, PLACE_KIND, SOURCE)
_RADEC_ARGS = (_BODY, INSTANT, SCALE, _EQUATORIAL_FRAME, PLACE_KIND, SOURCE)
_PLAIN_ARGS = (_BODY, INSTANT, SCALE, SOURCE)
_EVENT_ARGS = (_BODY, Arg("time", "time", "Search from this instant on (as for SKY.JD); the "
                          "first event after it is returned, within one synodic period."),
               SCALE, _PLANET_EVENT, EVENT_RESULT_SCALE, SOURCE)


def _planet(name, method, summary, result, impl, args, note="", result_kind="number"):
    return CellFunction(name=name, method=method, summary=summary, args=args, result=result,
                        result_kind=result_kind, impl=impl, model=note + _PLANET_MODEL)


FAMILY = Family("planets", "The planets, and the ephemeris sources", (
    _planet("SKY.PLANET.HELIO.LON", "skyPlanetHelioLon", "Heliocentric ecliptic longitude "
            "of a planet.", "degrees in [0, 360)", "planets:helio_lon_cells", _HELIO_ARGS,
            _HELIO_NOTE),
    _planet("SKY.PLANET.HELIO.LAT", "skyPlanetHelioLat", "Heliocentric ecliptic latitude "
            "of a planet.", "degrees", "planets:helio_lat_cells", _HELIO_ARGS, _HELIO_NOTE),
    _planet("SKY.PLANET.HELIO.DIST", "skyPlanetHelioDist", "Distance of a planet from the "
            "Sun's centre.", "astronomical units", "planets:helio_dist_cells",
            _PLAIN_ARGS, _HELIO_NOTE),
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
            _EVENT_ARGS,
            "In geocentric apparent ecliptic longitude (the almanacs' convention): the "
            "planet's minus the Sun's is 180 degrees at opposition and 0 at conjunction; "
            "found by the one event search to well under a second of the model. "
            + _GEOCENTRIC_NOTE, result_kind="datetime"),
    CellFunction(
        name="SKY.EPHEMERIS", method="skyEphemeris",
        summary="Which ephemeris a source is: its name, where its files were found (for "
        "DE440 and DE441), the span of dates it covers and what it holds (to show beside "
        "results, so a sheet says where its numbers came from).",
        args=(Arg("source", "text", SOURCE.description, default=vocab.BUILTIN),),
        result="text", result_kind="text",
        impl="ephemeris:describe_cells",
        model=SOURCE_NOTE),
))
