"""Meteor rates: the zenithal hourly rate and the radiant's drift."""

from .common import Arg, CellFunction, Family, angle_arg

_ZHR_ARGS = (
    Arg("count", "number", "The number of meteors of the shower seen (a whole number)."),
    Arg("hours", "number", "The effective observing time in hours: the watch less breaks "
        "and time spent writing."),
    Arg("limiting_mag", "number", "The limiting magnitude at the centre of the field, from "
        "star counts (0 to 9)."),
    angle_arg("radiant_alt", "The radiant's altitude at the middle of the watch (above 0; "
              "customarily above about 20 degrees)"),
    Arg("population_index", "number", "The shower's population index r, the ratio of "
        "meteors in one magnitude class to the next brighter (more than 1; usually 2 to "
        "3.5)."),
    Arg("cloud", "number", "The fraction of the field hidden by cloud, 0 to below 1 (0.2 for "
        "20 %). Default 0.", default=0.0),
    Arg("exponent", "number", "The exponent gamma of sin(radiant altitude). Default 1, the "
        "usual form.", default=1.0),
)
_ZHR_MODEL = (
    "ZHR = N r^(6.5 - LM) / ((1 - k) T_eff sin(h_R)^gamma), the formula of visual meteor "
    "work (common practice): the hourly count corrected to a limiting magnitude of 6.5, the "
    "radiant at the zenith and a clear sky. Its uncertainty from the Poisson statistics of "
    "the count is ZHR / sqrt(N). Low radiants and poor skies make large corrections: "
    "observers customarily leave out watches with the radiant below 20 degrees or a "
    "limiting magnitude under about 5.5."
)
_DRIFT_ARGS = (
    angle_arg("ra", "RA of the radiant at the reference solar longitude (J2000)"),
    angle_arg("dec", "Dec of the radiant at the reference solar longitude (J2000)"),
    angle_arg("reference_lon", "The solar longitude (J2000) of the reference place"),
    angle_arg("solar_lon", "The solar longitude (J2000) wanted, e.g. from SKY.SUN.SOLARLON"),
    Arg("ra_drift", "number", "The radiant's daily drift in RA, degrees a day."),
    Arg("dec_drift", "number", "The radiant's daily drift in Dec, degrees a day."),
)
_DRIFT_MODEL = (
    "Linear drift, common practice of meteor shower lists: the reference place plus the "
    "daily drift times the days between the two solar longitudes (their difference taken "
    "within +-180 degrees, at 360 / 365.2422 degrees a day). Good for the days of a "
    "shower's activity around the reference; far from it the true path curves."
)

FAMILY = Family("meteors", "Meteor rates: zenithal hourly rate and radiant drift", (
    CellFunction(
        name="SKY.METEOR.ZHR", method="skyMeteorZhr",
        summary="The zenithal hourly rate of a meteor shower from one watch: the count "
        "corrected for the limiting magnitude, the radiant's altitude and cloud.",
        args=_ZHR_ARGS, result="meteors per hour", impl="meteors:zhr_cells",
        model=_ZHR_MODEL),
    CellFunction(
        name="SKY.METEOR.ZHR.ERROR", method="skyMeteorZhrError",
        summary="The Poisson uncertainty of a zenithal hourly rate, ZHR / sqrt(N).",
        args=_ZHR_ARGS, result="meteors per hour (one standard deviation)",
        impl="meteors:zhr_error_cells", model=_ZHR_MODEL),
    CellFunction(
        name="SKY.METEOR.RADIANT.RA", method="skyMeteorRadiantRa",
        summary="Right ascension of a shower's radiant at a solar longitude, from a "
        "reference place and its daily drift.",
        args=_DRIFT_ARGS, result="degrees in [0, 360)", impl="meteors:radiant_ra_cells",
        model=_DRIFT_MODEL),
    CellFunction(
        name="SKY.METEOR.RADIANT.DEC", method="skyMeteorRadiantDec",
        summary="Declination of a shower's radiant at a solar longitude, from a reference "
        "place and its daily drift.",
        args=_DRIFT_ARGS, result="degrees", impl="meteors:radiant_dec_cells",
        model=_DRIFT_MODEL),
))
