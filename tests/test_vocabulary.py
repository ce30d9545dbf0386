"""The vocabulary says each fact once; here each stated validity span is held against the
span the code enforces, and the shared constants against ERFA's.

For every model with a validity span (the obliquity formulas, the nutation series, the
precession models, the IAU 2006/2000A systems of date and the horizon, the built-in
theories) three things must agree: the span in ``calcfuncs.vocabulary``, the span the
function's Function Wizard text states, and what a cell computes just inside and just
outside that span (a number, then a ``#SKY:`` message).  The spans themselves are the
papers' own statements as recorded in vocabulary.py (from memory; see there).
"""

import re

import erfa
import pytest

from calcfuncs import registry, vocabulary
from calcfuncs.cells import evaluate
from calcfuncs.errors import PREFIX

STEP = 0.01  # years: about 3.7 days inside or outside a span's end


def jd_text(year):
    """A Julian epoch (TT) as the JD text a cell takes."""
    return f"JD {vocabulary.J2000_JD + (year - 2000.0) * vocabulary.JULIAN_YEAR_DAYS!r}"


def stated(span):
    """The ways a Wizard text may write a span: 1000-3000, or -8000 to 12000."""
    low, high = (f"{y:g}" for y in span)
    return (f"{low}-{high}", f"{low} to {high}")


def says(text, span, before="", after=""):
    """Whether ``text`` states ``span`` between ``before`` and ``after`` (regexes)."""
    return any(re.search(before + re.escape(s) + after, text) for s in stated(span))


def arg(name, arg_name):
    return next(a for a in registry.BY_NAME[name].args if a.name == arg_name)


def computes_inside_and_refuses_outside(name, make_args, span):
    low, high = span
    for year in (low + STEP, high - STEP):
        value = evaluate(name, make_args(year))
        assert isinstance(value, float), (name, year, value)
    for year in (low - STEP, high + STEP):
        value = evaluate(name, make_args(year))
        assert isinstance(value, str) and value.startswith(PREFIX), (name, year, value)
        # The message states the same span (the cells' one wording, "1000 to 3000").
        assert vocabulary.years_text(span) in value, value


# ---- the obliquity formulas -------------------------------------------------------------

@pytest.mark.parametrize("model", vocabulary.OBLIQUITY_MODELS)
def test_obliquity_model_span_stated_and_enforced(model):
    span = vocabulary.OBLIQUITY_VALIDITY[model]
    for name in ("SKY.OBLIQUITY", "SKY.OBLIQUITY.TRUE"):
        # "IAU2006 (default; 1000-3000), ... NEWCOMB (900-2900) ..."
        assert says(arg(name, "model").description, span, rf"{model} \((default; )?", r"\)"), name
    computes_inside_and_refuses_outside(
        "SKY.OBLIQUITY", lambda y: (jd_text(y), "TT", model), span)


# ---- the nutation series ----------------------------------------------------------------

@pytest.mark.parametrize("model", vocabulary.NUTATION_MODELS)
def test_nutation_series_span_stated_and_enforced(model):
    span = vocabulary.NUTATION_VALIDITY[model]
    for name in ("SKY.OBLIQUITY.TRUE", "SKY.NUTATION.LON", "SKY.NUTATION.OBL"):
        text = arg(name, "nutation").description
        assert model in text and says(text, span, r"valid "), name
        assert says(registry.BY_NAME[name].model, span, r"Outside "), name
    for name in ("SKY.NUTATION.LON", "SKY.NUTATION.OBL"):
        computes_inside_and_refuses_outside(name, lambda y: (jd_text(y), "TT", model), span)
    computes_inside_and_refuses_outside(
        "SKY.OBLIQUITY.TRUE", lambda y: (jd_text(y), "TT", "VONDRAK2011", model), span)


# ---- the precession models --------------------------------------------------------------

PRECESSION_SPANS = {"IAU2006": vocabulary.IAU2006_YEARS, "VONDRAK2011": vocabulary.VONDRAK_YEARS}


def test_every_precession_model_has_a_span():
    assert set(vocabulary.PRECESSION_MODELS) == {"AUTO"} | set(PRECESSION_SPANS)


@pytest.mark.parametrize("model", sorted(PRECESSION_SPANS))
@pytest.mark.parametrize("name", ["SKY.PRECESS.RA", "SKY.PRECESS.DEC"])
def test_precession_model_span_stated_and_enforced(name, model):
    span = PRECESSION_SPANS[model]
    # "IAU2006 (Capitaine et al. 2003, 1000-3000) or VONDRAK2011 (Vondrak et al. 2011, ...)"
    assert says(arg(name, "model").description, span, rf"{model} \([^()]*, ", r"\)")
    # the epoch precessed to, from J2000.0
    computes_inside_and_refuses_outside(
        name, lambda y: (10.0, 20.0, "J2000.0", jd_text(y), "TT", model), span)


def test_auto_precession_switches_at_the_stated_span():
    text = arg("SKY.PRECESS.RA", "model").description
    assert says(text, vocabulary.IAU2006_YEARS, r"AUTO \(default: IAU2006 when both epochs "
                                                r"are within ")
    # Outside the IAU 2006 span AUTO computes (long-term precession), where IAU2006 refuses.
    low = vocabulary.IAU2006_YEARS[0]
    auto = evaluate("SKY.PRECESS.RA", (10.0, 20.0, "J2000.0", jd_text(low - STEP), "TT"))
    assert isinstance(auto, float), auto


# ---- the IAU 2006/2000A systems of date, sidereal time and the horizon ------------------

@pytest.mark.parametrize("system", vocabulary.DATED_SYSTEMS)
def test_dated_system_span_stated_and_enforced(system):
    span = vocabulary.IAU2006_YEARS
    for name in ("SKY.COORD.LON", "SKY.COORD.LAT", "SKY.COORD.X"):
        assert says(registry.BY_NAME[name].model, span, r"DATE and TRUE systems are valid "), name
    computes_inside_and_refuses_outside(
        "SKY.COORD.LON", lambda y: (10.0, 20.0, "ICRS", system, jd_text(y), "TT"), span)
    computes_inside_and_refuses_outside(
        "SKY.COORD.LAT", lambda y: (10.0, 20.0, system, "ICRS", jd_text(y), "TT"), span)


@pytest.mark.parametrize("kind", ["GAST", "GMST"])
def test_sidereal_time_span_stated_and_enforced(kind):
    span = vocabulary.IAU2006_YEARS
    assert says(registry.BY_NAME["SKY.SIDEREAL"].model, span, r"GAST and GMST valid ")
    computes_inside_and_refuses_outside(
        "SKY.SIDEREAL", lambda y: (jd_text(y), "TT", kind), span)


HORIZON_FUNCTIONS = ["SKY.HOURANGLE", "SKY.HORIZON.ALT", "SKY.HORIZON.AZ", "SKY.PARALLACTIC"]


def _at_site(year):
    return (10.0, 20.0, jd_text(year), 50.0, 10.0, "TT")


@pytest.mark.parametrize("name", HORIZON_FUNCTIONS)
def test_horizon_span_stated_and_enforced(name):
    span = vocabulary.IAU2006_YEARS
    assert says(registry.BY_NAME[name].model, span, r"Valid ", r"\.")
    low, high = span
    assert isinstance(evaluate(name, _at_site(high - STEP)), float)
    for year in (low - STEP, high + STEP):
        value = evaluate(name, _at_site(year))
        assert value.startswith(PREFIX) and vocabulary.years_text(span) in value, value


@pytest.mark.parametrize("name", HORIZON_FUNCTIONS)
def test_horizon_computes_early_in_its_stated_span(name):
    assert isinstance(evaluate(name, _at_site(vocabulary.IAU2006_YEARS[0] + STEP)), float)


# ---- the built-in source (ERFA epv00, moon98, plan94; VSOP87D and ELP-2000/82 outside) ----

@pytest.mark.parametrize("name, make_args", [
    ("SKY.SUN.LON", lambda y: (jd_text(y), "TT")),
    ("SKY.MOON.LON", lambda y: (jd_text(y), "TT")),
    ("SKY.PLANET.LON", lambda y: ("MARS", jd_text(y), "TT")),
], ids=["sun", "moon", "planet"])
def test_builtin_theories_span_stated_and_enforced(name, make_args):
    span = vocabulary.LONG_RANGE_YEARS
    assert says(registry.BY_NAME[name].model, span, r"; ", r" accepted") or says(
        registry.BY_NAME[name].model, span, r"accepted "), name
    computes_inside_and_refuses_outside(name, make_args, span)


# ---- words: the registry offers what the vocabulary lists ---------------------------------

def test_registry_choices_are_the_vocabularys_words():
    assert arg("SKY.OBLIQUITY", "model").choices == vocabulary.OBLIQUITY_MODELS
    assert arg("SKY.NUTATION.LON", "nutation").choices == vocabulary.NUTATION_MODELS
    assert arg("SKY.PRECESS.RA", "model").choices == vocabulary.PRECESSION_MODELS
    assert arg("SKY.DELTAT", "model").choices == vocabulary.DELTA_T_CHOICES
    assert arg("SKY.COORD.LON", "from_system").choices == vocabulary.SYSTEMS
    assert arg("SKY.COORD.LON", "to_system").aliases == vocabulary.SYSTEM_ALIASES
    assert arg("SKY.SIDEREAL", "kind").choices == vocabulary.SIDEREAL_KINDS
    assert arg("SKY.HOURANGLE", "frame").choices == vocabulary.HORIZON_FRAMES
    assert arg("SKY.AIRMASS", "model").choices == vocabulary.AIRMASS_MODELS
    assert arg("SKY.SUN.LON", "kind").choices == vocabulary.KINDS
    assert arg("SKY.PLANET.LON", "body").choices == vocabulary.PLANETS
    assert set(arg("SKY.SUN.LON", "frame").choices) == set(vocabulary.ECLIPTIC_OF_FRAME)
    assert set(arg("SKY.PLANET.RA", "frame").choices) == set(vocabulary.EQUATORIAL_OF_FRAME)
    for fn in registry.FUNCTIONS:
        for a in fn.args:
            if a.kind == "scale":
                assert a.choices == vocabulary.SCALES, (fn.name, a.name)
            if a.kind == "source":
                assert a.default == vocabulary.BUILTIN, fn.name
    # One name, one meaning: the registry no longer has a DELTA_T_MODELS of its own.
    assert not hasattr(registry, "DELTA_T_MODELS")
    assert set(vocabulary.DELTA_T_MODELS) < set(vocabulary.DELTA_T_CHOICES)


def test_the_sun_caution_is_said_wherever_the_sun_is():
    assert vocabulary.SUN_CAUTION_SHORT in registry.FAMILIES["sun"]
    for fn in registry.FUNCTIONS:
        if fn.family == "sun":
            assert vocabulary.SUN_CAUTION in fn.model, fn.name


# ---- shared constants against ERFA's --------------------------------------------------------

def test_constants_are_erfas():
    # IAU 2012 Resolution B2: the au is 149,597,870,700 m exactly (ERFA DAU, in metres).
    assert vocabulary.AU_KM == erfa.DAU / 1000.0
    # Light time for one au, IERS Conventions 2010 (ERFA AULT, seconds).
    assert vocabulary.AU_LIGHT_SECONDS == erfa.AULT
    assert vocabulary.LIGHT_DAYS_PER_AU == erfa.AULT / erfa.DAYSEC
    # The epoch J2000.0, the MJD zero point, the Julian year and the day (ERFA DJ00,
    # DJM0, DJY, DAYSEC: the IAU's definitions).
    assert vocabulary.J2000_JD == erfa.DJ00
    assert vocabulary.MJD_ZERO == erfa.DJM0
    assert vocabulary.JULIAN_YEAR_DAYS == erfa.DJY
    assert vocabulary.DAY_SECONDS == erfa.DAYSEC
