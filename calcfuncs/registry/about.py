"""About the add-in itself."""

from .common import CellFunction, Family

FAMILY = Family("about", "About the add-in", (
    CellFunction(
        name="SKY.VERSION",
        method="skyVersion",
        summary="Which Eclipsheet and ERFA computed this sheet, for the record kept with it.",
        args=(),
        result='text such as "Eclipsheet 0.1.0; ERFA 2.0.1; numpy 2.4.6"',
        result_kind="text",
        impl="about:version_text",
    ),
))
