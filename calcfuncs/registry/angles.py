"""The angle functions: sexagesimal text in and out, wrapping."""

from .common import Arg, CellFunction, Family

_TEXT_STYLES = ("MARKS", "COLONS", "SPACES")
_DEGREES = Arg("degrees", "angle", "The angle in decimal degrees (or angle text).")

FAMILY = Family("angles", "Angles: sexagesimal text, formatting, wrapping", (
    CellFunction(
        name="SKY.ANGLE",
        method="skyAngle",
        summary="Sexagesimal or decimal text to decimal degrees: -23°26'21.4\", "
        "-23 26 21.4, -23:26:21.4, 23d26m21.4s or -23.4393; text marked with h "
        "(12h34m56.7s) is read as hours.",
        args=(
            Arg(
                "text",
                "text",
                "The angle as text (unmarked fields are degrees, arcminutes, arcseconds), "
                "or a number of degrees, which is returned as it is.",
            ),
        ),
        result="decimal degrees",
        impl="angles:angle_from_text",
    ),
    CellFunction(
        name="SKY.ANGLE.HOURS",
        method="skyAngleHours",
        summary="Right-ascension style text to decimal degrees: 12:34:56.7, 12 34 56.7 "
        "and 12h34m56.7s are hours, minutes, seconds of time (1 h = 15 degrees).",
        args=(
            Arg(
                "text",
                "text",
                "The angle as text (unmarked fields are hours, minutes, seconds), or a "
                "number of hours.",
            ),
        ),
        result="decimal degrees",
        impl="angles:angle_from_hours_text",
    ),
    CellFunction(
        name="SKY.TEXT.DMS",
        method="skyTextDms",
        summary="Decimal degrees to signed degrees, arcminutes, arcseconds text, as "
        "declinations and latitudes are written.",
        args=(
            _DEGREES,
            Arg("decimals", "count", "Decimal places of the arcseconds, 0 to 9. Default 1.",
                default=1),
            Arg("style", "choice",
                "MARKS (default, +23°26'21.4\"), COLONS (+23:26:21.4) or SPACES "
                "(+23 26 21.4).", default="MARKS", choices=_TEXT_STYLES),
        ),
        result="text such as +23°26'21.4\"",
        result_kind="text",
        impl="angles:dms_text",
    ),
    CellFunction(
        name="SKY.TEXT.HMS",
        method="skyTextHms",
        summary="Decimal degrees to hours, minutes, seconds text (1 h = 15 degrees), as "
        "right ascensions are written; the angle is first brought into 0-360 degrees.",
        args=(
            _DEGREES,
            Arg("decimals", "count", "Decimal places of the seconds, 0 to 9. Default 2.",
                default=2),
            Arg("style", "choice",
                "MARKS (default, 12h34m56.78s), COLONS (12:34:56.78) or SPACES "
                "(12 34 56.78).", default="MARKS", choices=_TEXT_STYLES),
        ),
        result='text such as "12h34m56.78s"',
        result_kind="text",
        impl="angles:hms_text",
    ),
    CellFunction(
        name="SKY.WRAP.360",
        method="skyWrap360",
        summary="An angle brought into the range 0 to 360 degrees (360 excluded).",
        args=(_DEGREES,),
        result="decimal degrees in [0, 360)",
        impl="angles:wrap_360",
    ),
    CellFunction(
        name="SKY.WRAP.180",
        method="skyWrap180",
        summary="An angle brought into the range -180 to +180 degrees (-180 excluded).",
        args=(_DEGREES,),
        result="decimal degrees in (-180, 180]",
        impl="angles:wrap_180",
    ),
))
