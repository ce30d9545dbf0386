"""The obliquity of the ecliptic and nutation."""

from .. import vocabulary as vocab
from .common import SCALE, Arg, CellFunction, Family, choices_text, span_text, time_arg

_OBLIQUITY_DEFAULT = "IAU2006"
_OBLIQUITY_MODEL = Arg(
    "model",
    "choice",
    "Mean obliquity formula: " + choices_text(vocab.OBLIQUITY_MODELS, {
        m: ("default; " if m == _OBLIQUITY_DEFAULT else "") + span_text(span)
        for m, span in vocab.OBLIQUITY_VALIDITY.items()}) + ".",
    default=_OBLIQUITY_DEFAULT,
    choices=vocab.OBLIQUITY_MODELS,
)

_NUTATION_DEFAULT = "IAU2000A"
# The three series share one span, so the texts say it once.
_NUTATION_SPAN, = set(vocab.NUTATION_VALIDITY.values())
_NUTATION_WORDS = (choices_text(vocab.NUTATION_MODELS, {_NUTATION_DEFAULT: "default"})
                   + f"; each valid {span_text(_NUTATION_SPAN)}")
_NUTATION_OUTSIDE = f"Outside {span_text(_NUTATION_SPAN)} the cell says so."
_NUTATION_MODEL = Arg(
    "nutation",
    "choice",
    "Nutation series: " + _NUTATION_WORDS + ".",
    default=_NUTATION_DEFAULT,
    choices=vocab.NUTATION_MODELS,
    noun="nutation model",
)
_ANGLE_UNIT = Arg(
    "unit",
    "choice",
    "Unit of the result: DEG (default, decimal degrees), ARCSEC or RAD.",
    default="DEG",
    choices=("DEG", "ARCSEC", "RAD"),
)
_OBLIQUITY_MODELS_TEXT = (
    "Models: IAU2006 (Hilton et al. 2006, ERFA obl06), IAU1980 (Lieske et al. 1977, "
    "ERFA obl80), NEWCOMB (Newcomb's formula, tropical centuries from B1900.0), "
    "LASKAR1986 (Laskar 1986 polynomial, 10,000-year units), VONDRAK2011 (angle between "
    "the long-term equator and ecliptic poles of Vondrak et al. 2011, ERFA ltpequ/ltpecl). "
    "Outside a model's range the cell says so and names one that covers the date."
)
_NUTATION_MODELS_TEXT = (
    "Series: IAU2000A (Mathews et al. 2002 with the IAU 2006 adjustments: the model of "
    "ERFA nut06a, evaluated by the add-in within 1e-6 micro-arcsecond of it), "
    "IAU2000B (McCarthy and Luzum 2003, 1 mas within 1995-2050, ERFA nut00b), IAU1980 "
    "(Wahr 1981, ERFA nut80). " + _NUTATION_OUTSIDE
)
_NUTATION_RESULT = "angle in the chosen unit (degrees by default; ARCSEC is usual)"

FAMILY = Family("obliquity", "Obliquity of the ecliptic and nutation", (
    CellFunction(
        name="SKY.OBLIQUITY",
        method="skyObliquity",
        summary="Mean obliquity of the ecliptic: the angle between the mean equator and "
        "the ecliptic of date.",
        args=(time_arg(), SCALE, _OBLIQUITY_MODEL, _ANGLE_UNIT),
        result="angle in the chosen unit (degrees by default)",
        impl="obliquity:mean_obliquity_cells",
        model=_OBLIQUITY_MODELS_TEXT + " The date is taken as TT (TDB for the IAU "
        "formulas; the difference is negligible here).",
    ),
    CellFunction(
        name="SKY.OBLIQUITY.TRUE",
        method="skyObliquityTrue",
        summary="True obliquity of the ecliptic: mean obliquity plus the nutation in "
        "obliquity, the angle between the true equator and the ecliptic of date.",
        args=(time_arg(), SCALE, _OBLIQUITY_MODEL, _NUTATION_MODEL, _ANGLE_UNIT),
        result="angle in the chosen unit (degrees by default)",
        impl="obliquity:true_obliquity_cells",
        model=_OBLIQUITY_MODELS_TEXT + " " + _NUTATION_MODELS_TEXT + " Consistent pairs "
        "are IAU2006 with IAU2000A and IAU1980 with IAU1980.",
    ),
    CellFunction(
        name="SKY.NUTATION.LON",
        method="skyNutationLon",
        summary="Nutation in longitude (delta psi): the shift of the true equinox along "
        "the ecliptic from the mean equinox.",
        args=(time_arg(), SCALE, _NUTATION_MODEL, _ANGLE_UNIT),
        result=_NUTATION_RESULT,
        impl="obliquity:nutation_lon_cells",
        model=_NUTATION_MODELS_TEXT,
    ),
    CellFunction(
        name="SKY.NUTATION.OBL",
        method="skyNutationObl",
        summary="Nutation in obliquity (delta epsilon): true minus mean obliquity.",
        args=(time_arg(), SCALE, _NUTATION_MODEL, _ANGLE_UNIT),
        result=_NUTATION_RESULT,
        impl="obliquity:nutation_obl_cells",
        model=_NUTATION_MODELS_TEXT,
    ),
))
