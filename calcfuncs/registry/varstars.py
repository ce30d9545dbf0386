"""Variable stars: phase, cycle and O - C against an ephemeris; times of minimum."""

from .common import Arg, CellFunction, Family

_EPHEMERIS_ARGS = (
    Arg("time", "number", "The time of the observation or of the minimum, in days: a JD such "
        "as a BJD_TDB or HJD number (e.g. from SKY.BJD.TDB), on the same basis as the epoch."),
    Arg("epoch", "number", "The ephemeris' epoch T0 (a minimum or maximum), in days on the "
        "same basis."),
    Arg("period", "number", "The period P in days."),
    Arg("quadratic", "number", "The quadratic term Q in days of T0 + P E + Q E^2, for a "
        "changing period (dP/dE = 2Q). Default 0: a constant period.", default=0.0),
)
_EPHEMERIS_MODEL = (
    "Ephemeris T(E) = T0 + P E + Q E^2 (common practice): the cycle count E solves T(E) = "
    "time. Any time basis, as long as the time and the epoch share it (BJD_TDB and HJD_UTC "
    "differ by over a minute)."
)
_SERIES_ARGS = (
    Arg("times", "series", "The range of observation times in days (e.g. BJD_TDB or HJD "
        "numbers), one a row, around one minimum; in any order."),
    Arg("magnitudes", "series", "The range of magnitudes, one for each time (the same "
        "number of cells)."),
)
_KVW_MODEL = (
    "The method of Kwee and van Woerden (1956): the light curve, interpolated to equal "
    "steps, is folded about trial times; the sum of squared differences of the folded "
    "branches is fitted by a parabola through three trial times one step apart, whose "
    "lowest point is the time of minimum. Uncertainty sigma^2 = (4AC - B^2) / (4A^2 (Z - "
    "1)) with Z a quarter of the observations used. The rows should cover both branches "
    "of one minimum (at least 8 rows); the time of symmetry is found, so a maximum works "
    "too. In our tests with noise of known size the stated uncertainty matched the "
    "scatter of the found times."
)

FAMILY = Family("varstars", "Variable stars: ephemerides and times of minimum", (
    CellFunction(
        name="SKY.VARSTAR.PHASE", method="skyVarstarPhase",
        summary="The phase of a time against a variable star's ephemeris: the fractional "
        "part of the cycle count.", args=_EPHEMERIS_ARGS, result="phase in [0, 1)",
        impl="varstars:phase_cells", model=_EPHEMERIS_MODEL),
    CellFunction(
        name="SKY.VARSTAR.CYCLE", method="skyVarstarCycle",
        summary="The cycle number of a time against an ephemeris: the nearest whole E.",
        args=_EPHEMERIS_ARGS, result="a whole number of cycles",
        impl="varstars:cycle_cells", model=_EPHEMERIS_MODEL),
    CellFunction(
        name="SKY.VARSTAR.OC", method="skyVarstarOc",
        summary="O - C: a time of minimum (or maximum) minus the ephemeris' time at the "
        "nearest whole cycle.", args=_EPHEMERIS_ARGS, result="days (positive: late)",
        impl="varstars:o_minus_c_cells", model=_EPHEMERIS_MODEL),
    CellFunction(
        name="SKY.VARSTAR.MINIMUM", method="skyVarstarMinimum",
        summary="The time of a minimum from a range of times and a range of magnitudes, by "
        "the method of Kwee and van Woerden.", args=_SERIES_ARGS,
        result="the time of minimum, in the days of the times given",
        impl="varstars:minimum_cells", model=_KVW_MODEL),
    CellFunction(
        name="SKY.VARSTAR.MINIMUM.ERROR", method="skyVarstarMinimumError",
        summary="The uncertainty of a time of minimum by the method of Kwee and van "
        "Woerden.", args=_SERIES_ARGS, result="days (one standard deviation)",
        impl="varstars:minimum_error_cells", model=_KVW_MODEL),
))
