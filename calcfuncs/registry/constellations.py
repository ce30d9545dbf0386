"""The IAU constellations: of a direction, and of the Sun, the Moon or a planet."""

from .. import vocabulary as vocab
from .common import (PLACE_KIND, SCALE, SOURCE, SOURCE_NOTE, Arg, CellFunction, Family,
                     angle_arg, span_text, system_arg, words)

_BOUNDARIES = (
    "The IAU boundaries of Delporte (1930) as tabulated by Roman (1987) on the mean equator "
    "and equinox of B1875.0 (CDS catalogue VI/42, kept in the add-in): the direction is "
    "precessed from the ICRS axes to B1875.0 with IAU 2006 (ERFA pmat06; within 0.03\" of "
    "astropy's FK5 at B1875.0 in our tests) and looked up by Roman's rule. Strips whose "
    "edges the catalogue rounds to 0.0001 h put a point within about 3\" of a boundary on "
    "either side, as any use of that table does."
)
_FORM = Arg("form", "choice", "ABBREVIATION (default: the IAU's three letters, e.g. Oph) "
            "or NAME (e.g. Ophiuchus).", default="ABBREVIATION",
            choices=("ABBREVIATION", "NAME"), aliases=(("ABBR", "ABBREVIATION"),))
_OPTIONAL_TIME = Arg(
    "time", "time",
    "The date of the DATE and TRUE systems (as for SKY.JD). Needed only for those "
    "systems; default none.", default=None)
_BODIES = ("SUN", "MOON") + vocab.PLANETS
_BODY = Arg("body", "choice", f"The body: {words(_BODIES)} (Pluto only from a JPL kernel).",
            choices=_BODIES)

FAMILY = Family("constellations", "Constellations (IAU boundaries)", (
    CellFunction(
        name="SKY.CONSTELLATION", method="skyConstellation",
        summary="The IAU constellation of a direction given in any coordinate system.",
        args=(angle_arg("lon", "Longitude of the direction: RA for equatorial systems"),
              angle_arg("lat", "Latitude of the direction: Dec for equatorial systems"),
              system_arg("system", "of the direction"), _OPTIONAL_TIME, SCALE, _FORM),
        result="text: the constellation's abbreviation or name", result_kind="text",
        impl="constellations:constellation_cells",
        model=_BOUNDARIES + " DATE and TRUE systems are valid "
        f"{span_text(vocab.IAU2006_YEARS)}; outside, the cell says so."),
    CellFunction(
        name="SKY.CONSTELLATION.BODY", method="skyConstellationBody",
        summary="The IAU constellation in which the Sun, the Moon or a planet stands, seen "
        "from the Earth's centre.",
        args=(_BODY, Arg("time", "time", "The instant (as for SKY.JD)."), SCALE, _FORM,
              PLACE_KIND, SOURCE),
        result="text: the constellation's abbreviation or name", result_kind="text",
        impl="constellations:body_constellation_cells",
        model="The body's geocentric place as SKY.SUN.RA, SKY.MOON.RA and SKY.PLANET.RA "
        "give it (APPARENT by default; the Moon's parallax, up to 1 degree, is not applied), "
        "then " + _BOUNDARIES[0].lower() + _BOUNDARIES[1:] + " " + SOURCE_NOTE + " "
        + vocab.SUN_CAUTION),
))
