"""Native Calc charts through UNO: an XY chart of computed columns, beside its table.

A chart made this way is part of the workbook (no macro): it refers to cell ranges,
so it redraws whenever the formulas in them compute new values.  The first column of
the range is the x of every series, each further column one series named by its
header cell, as Calc's own XY chart takes them.
"""

import uno

# com.sun.star.chart.ChartSymbolType.NONE: lines only, no marker at each point.
_NO_SYMBOL = -3
_AXIS_AT_START = uno.Enum("com.sun.star.chart.ChartAxisPosition", "START")


def _rectangle(x, y, width, height):
    rect = uno.createUnoStruct("com.sun.star.awt.Rectangle")
    rect.X, rect.Y, rect.Width, rect.Height = x, y, width, height
    return rect


def _range_address(sheet, first_col, first_row, last_col, last_row):
    return sheet.getCellRangeByPosition(first_col, first_row, last_col, last_row).RangeAddress


def xy_chart(sheet, name, columns, first_row, last_row, title, x_title, y_title,
             anchor_col, anchor_row=0, size_cm=(17.0, 10.0), lines=True, legend=True,
             x_format=None, shift_cm=0.0):
    """An XY chart named ``name`` of the table ``columns`` (0-based column numbers, the
    first one the x values; they need not be adjacent) from ``first_row`` (the header
    row, whose cells name the series) to ``last_row``, placed with its top-left corner
    at the cell (``anchor_col``, ``anchor_row``), moved ``shift_cm`` to the right.  ``x_format``: a number format key
    for the x axis's labels (dates say less than the cells' full date-time).  Returns
    the chart document."""
    origin = sheet.getCellByPosition(anchor_col, anchor_row).Position
    width, height = (int(cm * 1000) for cm in size_cm)
    ranges = tuple(_range_address(sheet, c, first_row, c, last_row) for c in columns)
    charts = sheet.getCharts()
    left = origin.X + int(shift_cm * 1000)
    charts.addNewByName(name, _rectangle(left, origin.Y, width, height), ranges,
                        True, False)
    chart = charts.getByName(name).getEmbeddedObject()
    diagram = chart.createInstance("com.sun.star.chart.XYDiagram")
    chart.setDiagram(diagram)
    diagram = chart.getDiagram()
    diagram.SymbolType = _NO_SYMBOL if lines else 0  # 0: the automatic markers
    diagram.Lines = lines
    chart.HasMainTitle = True
    chart.getTitle().String = title
    chart.HasLegend = legend
    diagram.HasXAxisTitle = True
    diagram.getXAxisTitle().String = x_title
    diagram.HasYAxisTitle = True
    diagram.getYAxisTitle().String = y_title
    # Each axis at the other's low end, not through zero: a curve that crosses zero
    # would otherwise run over the labels.
    diagram.getXAxis().CrossoverPosition = _AXIS_AT_START
    diagram.getYAxis().CrossoverPosition = _AXIS_AT_START
    if x_format is not None:
        axis = diagram.getXAxis()
        axis.LinkNumberFormatToSource = False
        axis.NumberFormat = x_format
    return chart


def chart_ranges(sheet, name):
    """The cell ranges a chart of the sheet draws, as (first col, first row, last col,
    last row) tuples, 0-based."""
    chart = sheet.getCharts().getByName(name)
    return [(r.StartColumn, r.StartRow, r.EndColumn, r.EndRow) for r in chart.getRanges()]
