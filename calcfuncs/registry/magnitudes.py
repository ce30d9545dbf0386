"""Planet magnitudes (Mallama and Hilton 2018)."""

from .. import vocabulary as vocab
from .common import INSTANT, SCALE, SOURCE, SOURCE_NOTE, Arg, CellFunction, Family, words

_PLANETS = tuple(p for p in vocab.PLANETS if p != "PLUTO")
_BODY = Arg("body", "choice", f"The planet: {words(_PLANETS)}.", choices=_PLANETS)

FAMILY = Family("magnitudes", "Planet magnitudes", (
    CellFunction(
        name="SKY.PLANET.MAGNITUDE", method="skyPlanetMagnitude",
        summary="The apparent visual (V) magnitude of a planet seen from the Earth's "
        "centre.",
        args=(_BODY, INSTANT, SCALE, SOURCE),
        result="magnitude (smaller is brighter)", impl="magnitudes:magnitude_cells",
        model="The formulas of Mallama and Hilton (2018, Astronomy and Computing 25), as "
        "The Astronomical Almanac uses them: 5 log10(r d) plus a polynomial in the phase "
        "angle, Saturn with its rings (the Saturnicentric latitudes of the Sun and the "
        "Earth), Uranus with the latitudes of the Earth and the Sun, Neptune brightening "
        "from 1980 to 2000. Within the phase angles each formula is fitted for (Mercury 2 "
        "to 170 degrees, Venus up to 179, Mars up to 50, Jupiter up to 12, Saturn up to 6.5 "
        "with the rings tilted at most 27 degrees); outside them the cell says so. Mars's "
        "small corrections for its rotation and season (up to about 0.1) are left out. The "
        "distances and the phase angle from the planet where the light left it (as "
        "SKY.PLANET.PHASE.ANGLE). " + SOURCE_NOTE),
))
