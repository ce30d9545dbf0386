"""UNO adapter: Calc's calls in, ``calcfuncs.cells.evaluate`` out.  No astronomy here.

Each method of the generated interface ``XSkyFunctions`` is one cell function; the
methods are made from ``calcfuncs.registry``, so this file never lists them.  numpy,
erfa and the core are imported on the first call, not at load: if they are missing,
every cell says which package to install instead of showing #NAME?.
"""

import os
import re
import sys

# The office's loader appends our pythonpath/ to sys.path, behind the interpreter's own
# site-packages.  A self-contained build brings numpy and erfa there, and an older numpy
# of the interpreter's must not shadow them: then our folder goes first.
_OWN_PATH = os.path.join(os.path.dirname(os.path.abspath(__file__)), "pythonpath")
_BUNDLED = os.path.isdir(os.path.join(_OWN_PATH, "numpy"))
if _BUNDLED:
    sys.path[:] = [_OWN_PATH] + [p for p in sys.path if os.path.normpath(p) != _OWN_PATH]

import unohelper  # noqa: E402
from com.sun.star.lang import XServiceInfo, XServiceName  # noqa: E402

from calcfuncs import registry  # noqa: E402
from org.eclipsheet.sky import XSkyFunctions  # noqa: E402

_core = None
_core_problem = None


def _load_core():
    """The cell evaluator, or ``None`` with the reason kept for the cells."""
    global _core, _core_problem
    if _core is None and _core_problem is None:
        try:
            from calcfuncs import cells

            _core = cells
        except ImportError as err:
            # The office's import hook rewords the error, so read the name from the text.
            found = re.search(r"No module named '([^'.]+)", str(err))
            missing = found.group(1) if found else (getattr(err, "name", None) or str(err))
            package = {"numpy": "python3-numpy", "erfa": "python3-erfa"}.get(missing, missing)
            import sysconfig

            office_python = (f"the office's Python {sys.version.split()[0]} "
                             f"({sysconfig.get_platform()}, in {sys.prefix})")
            if _BUNDLED:
                detail = (str(err).strip().splitlines() or [""])[0][:160]
                _core_problem = (
                    f"#SKY: {office_python} cannot import the {missing} inside this "
                    f"Eclipsheet build ({detail}); use a build made for this Python "
                    "version and platform"
                )
            else:
                _core_problem = (
                    f"#SKY: {office_python} cannot import {missing}; install it "
                    f"(Debian/Ubuntu: apt install {package}, elsewhere pip install numpy "
                    "pyerfa for that Python) or use the self-contained build of Eclipsheet"
                )
    return _core


# The last NullDate read and its fields, as one tuple (replaced whole, so a reader
# never pairs one date's struct with another's fields).  Comparing the struct just read
# with it is one call into the bridge; reading its three fields costs about five times
# that.  Reading the struct itself is the dearer part: a cell that takes a date-time
# value pays 9 to 15 us for getPropertyValue and 2 for the comparison (measured in Calc
# 7.4 on 2026-12-05, an experimental build; a boolean property costs 7, the bridge's own
# price of a call).  It is read for every such cell all the same: the null date can
# change between two calculations (the options, a macro), no listener reports it, and a
# cell must never answer from a stale one.
_LAST_NULL_DATE = [(None, (1899, 12, 30))]


def _null_date(doc_settings):
    try:
        d = doc_settings.getPropertyValue("NullDate")
        struct, fields = _LAST_NULL_DATE[0]
        if struct is None or not d == struct:
            fields = (d.Year, d.Month, d.Day)
            _LAST_NULL_DATE[0] = (d, fields)
        return fields
    except Exception:
        return (1899, 12, 30)


def _call(fn, doc_settings, args):
    """Methods return sequence<sequence<any>>: Calc shows a 1x1 result in a plain cell
    and fills an array formula with a larger one (an ``any`` return type cannot carry
    an array from Python).  Functions whose result is a text return a plain ``any``
    instead, one value per cell (see registry.CellFunction.returns_text: a
    function whose result_kind is "text")."""
    core = _load_core()
    if core is None:
        return _core_problem if fn.returns_text else ((_core_problem,),)
    try:
        # Read from the document whenever a date-time cell comes in or a date-time
        # value goes out (SKY.SEASON takes a year, yet answers a date-time value).
        null_date = _null_date(doc_settings) if fn.uses_null_date else (1899, 12, 30)
        result = core.evaluate(fn, args, null_date)
    except Exception as err:  # never let a defect reach the office as an exception
        result = f"#SKY: internal error ({type(err).__name__}: {err}); please report it"
    if fn.returns_text:
        if not isinstance(result, tuple):
            return result
        if len(result) == 1 and len(result[0]) == 1:
            return result[0][0]
        return (f"#SKY: {fn.name} gives one text per cell; fill the formula down rather "
                "than entering it as an array formula")
    return result if isinstance(result, tuple) else ((result,),)


def _method(fn):
    def method(self, doc_settings, *args):
        return _call(fn, doc_settings, args)

    method.__name__ = fn.method
    method.__doc__ = fn.summary
    return method


class SkyFunctions(unohelper.Base, XSkyFunctions, XServiceName, XServiceInfo):
    def __init__(self, ctx):
        self.ctx = ctx

    def getServiceName(self):
        return registry.IMPLEMENTATION_NAME

    def getImplementationName(self):
        return registry.IMPLEMENTATION_NAME

    def supportsService(self, name):
        return name in registry.SERVICE_NAMES

    def getSupportedServiceNames(self):
        return registry.SERVICE_NAMES


for _fn in registry.FUNCTIONS:
    setattr(SkyFunctions, _fn.method, _method(_fn))

g_ImplementationHelper = unohelper.ImplementationHelper()
g_ImplementationHelper.addImplementation(
    SkyFunctions, registry.IMPLEMENTATION_NAME, registry.SERVICE_NAMES
)
