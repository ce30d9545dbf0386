"""The one declaration of every Eclipsheet cell function.

Everything else is driven from this table: the UNO IDL and type library, the Function
Wizard texts (``CalcAddIns.xcu``), the components file, the function reference in
``docs/functions.md``, the adapter's dispatch, the cell layer and the Python API.
Declare a function once, in the module of its family, and the build does the rest:

    common       the declarations' types (Arg, CellFunction, Family), the kinds, and the
                 arguments several families share
    time, angles, obliquity, about, coordinates, horizon, sun, moon, planets,
    constellations, meteors, varstars, magnitudes, site,
    smallbodies, lunar, solar_eclipses, visibility
                 one module per family, its name and title said once (``FAMILY``)

Frozen names: ``IMPLEMENTATION_NAME`` and every ``method`` are stored inside each ODS
file that uses the function (``of:=ORG.ECLIPSHEET.SKY.SKYFUNCTIONS.SKYJD(...)``).  They
are a file format: never rename or remove one, add a new function instead.  A test
pins the full list.

This package imports nothing heavy; the ``impl`` of a function is a ``module:function``
path inside ``calcfuncs`` that the cell layer imports on first use.
"""

from . import (about, angles, constellations, coordinates, horizon, lunar, magnitudes, meteors,
               moon, obliquity, planets, site, smallbodies, solar_eclipses, sun,
               time, varstars, visibility)
from .common import (CATEGORY, EXTENSION_IDENTIFIER, IMPLEMENTATION_NAME, INTERFACE_MODULE,
                     INTERFACE_NAME, OPTION_KINDS, REQUIRED, RESULT_KINDS, ROW_KINDS,
                     SERIES_KINDS, SERVICE_NAMES, Arg, CellFunction, Family)

# The families in the order the reference and the function list show them.
FAMILY_ORDER = tuple(m.FAMILY for m in (
    about, time, angles, obliquity, coordinates, horizon, sun, moon, lunar, solar_eclipses,
    planets, constellations, meteors, varstars, magnitudes, site, smallbodies, visibility))

# Every function, in the order the interface has always declared them (the IDL, the xcu
# and the reference list them so): SKY.VERSION came after the obliquity family.
FUNCTIONS = tuple(f for m in (time, angles, obliquity, about, coordinates, horizon, sun,
                              moon, planets, constellations, meteors, varstars,
                              magnitudes, site, smallbodies, lunar, solar_eclipses,
                              visibility)
                  for f in m.FAMILY.functions)

FAMILIES = {family.name: family.title for family in FAMILY_ORDER}
BY_NAME = {f.name: f for f in FUNCTIONS}
BY_METHOD = {f.method: f for f in FUNCTIONS}

__all__ = [
    "CATEGORY", "EXTENSION_IDENTIFIER", "IMPLEMENTATION_NAME", "INTERFACE_MODULE",
    "INTERFACE_NAME", "OPTION_KINDS", "REQUIRED", "RESULT_KINDS", "ROW_KINDS", "SERIES_KINDS",
    "SERVICE_NAMES", "Arg", "CellFunction", "Family", "FAMILY_ORDER", "FUNCTIONS",
    "FAMILIES", "BY_NAME", "BY_METHOD",
]
