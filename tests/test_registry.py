"""The registry is the single source of the add-in's surface; these checks keep it whole.

ODS files store a call as IMPLEMENTATION_NAME.METHOD (see PLATFORM-NOTES), so the
names pinned here are a file format: a test fails if one is renamed or removed.
Add new functions to FROZEN_METHODS when they are declared; never edit a line.
"""

import importlib
import inspect
import os
import re
import sys

import pytest

from calcfuncs import registry

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
sys.path.insert(0, os.path.join(ROOT, "extension"))
import build  # noqa: E402

FROZEN_IMPLEMENTATION = "org.eclipsheet.sky.SkyFunctions"
FROZEN_METHODS = {
    "skyJd": "SKY.JD",
    "skyMjd": "SKY.MJD",
    "skyDatetime": "SKY.DATETIME",
    "skyJdDatetime": "SKY.JD.DATETIME",
    "skyMjdDatetime": "SKY.MJD.DATETIME",
    "skyTextIso": "SKY.TEXT.ISO",
    "skyDeltaT": "SKY.DELTAT",
    "skyAngle": "SKY.ANGLE",
    "skyAngleHours": "SKY.ANGLE.HOURS",
    "skyTextDms": "SKY.TEXT.DMS",
    "skyTextHms": "SKY.TEXT.HMS",
    "skyWrap360": "SKY.WRAP.360",
    "skyWrap180": "SKY.WRAP.180",
    "skyObliquity": "SKY.OBLIQUITY",
    "skyObliquityTrue": "SKY.OBLIQUITY.TRUE",
    "skyNutationLon": "SKY.NUTATION.LON",
    "skyNutationObl": "SKY.NUTATION.OBL",
    "skyVersion": "SKY.VERSION",
    "skyCoordLon": "SKY.COORD.LON",
    "skyCoordLat": "SKY.COORD.LAT",
    "skyCoordX": "SKY.COORD.X",
    "skyCoordY": "SKY.COORD.Y",
    "skyCoordZ": "SKY.COORD.Z",
    "skyRectLon": "SKY.RECT.LON",
    "skyRectLat": "SKY.RECT.LAT",
    "skyRectDist": "SKY.RECT.DIST",
    "skyPrecessRa": "SKY.PRECESS.RA",
    "skyPrecessDec": "SKY.PRECESS.DEC",
    "skyProperRa": "SKY.PROPER.RA",
    "skyProperDec": "SKY.PROPER.DEC",
    "skySeparation": "SKY.SEPARATION",
    "skyPositionAngle": "SKY.POSITION.ANGLE",
    "skySidereal": "SKY.SIDEREAL",
    "skyHourangle": "SKY.HOURANGLE",
    "skyHorizonAlt": "SKY.HORIZON.ALT",
    "skyHorizonAz": "SKY.HORIZON.AZ",
    "skyHorizonRa": "SKY.HORIZON.RA",
    "skyHorizonDec": "SKY.HORIZON.DEC",
    "skyParallactic": "SKY.PARALLACTIC",
    "skyAirmass": "SKY.AIRMASS",
    "skyDeltaTUncertainty": "SKY.DELTAT.UNCERTAINTY",
    "skyLeapseconds": "SKY.LEAPSECONDS",
    "skyLeapsecondsUntil": "SKY.LEAPSECONDS.UNTIL",
    "skyTextDate": "SKY.TEXT.DATE",
    "skySunLon": "SKY.SUN.LON",
    "skySunLat": "SKY.SUN.LAT",
    "skySunRa": "SKY.SUN.RA",
    "skySunDec": "SKY.SUN.DEC",
    "skySunDist": "SKY.SUN.DIST",
    "skySunSolarlon": "SKY.SUN.SOLARLON",
    "skySunEqtime": "SKY.SUN.EQTIME",
    "skySunSundial": "SKY.SUN.SUNDIAL",
    "skySeason": "SKY.SEASON",
    "skySeasonLength": "SKY.SEASON.LENGTH",
    "skySunReaches": "SKY.SUN.REACHES",
    "skySunRise": "SKY.SUN.RISE",
    "skySunSet": "SKY.SUN.SET",
    "skySunDaylength": "SKY.SUN.DAYLENGTH",
    "skySunTransit": "SKY.SUN.TRANSIT",
    "skySunElongation": "SKY.SUN.ELONGATION",
    "skySunRelativeLon": "SKY.SUN.RELATIVE.LON",
    "skySunRelativeLat": "SKY.SUN.RELATIVE.LAT",
    "skyMoonLon": "SKY.MOON.LON",
    "skyMoonLat": "SKY.MOON.LAT",
    "skyMoonRa": "SKY.MOON.RA",
    "skyMoonDec": "SKY.MOON.DEC",
    "skyMoonDist": "SKY.MOON.DIST",
    "skyMoonElongation": "SKY.MOON.ELONGATION",
    "skyMoonPhaseAngle": "SKY.MOON.PHASE.ANGLE",
    "skyMoonIlluminated": "SKY.MOON.ILLUMINATED",
    "skyMoonAge": "SKY.MOON.AGE",
    "skyMoonNode": "SKY.MOON.NODE",
    "skyMoonPhaseNext": "SKY.MOON.PHASE.NEXT",
    "skyEclipseNodeDistance": "SKY.ECLIPSE.NODE.DISTANCE",
    "skyEclipsePossible": "SKY.ECLIPSE.POSSIBLE",
    "skyBjdTdb": "SKY.BJD.TDB",
    "skyHjdUtc": "SKY.HJD.UTC",
    "skyHjdTt": "SKY.HJD.TT",
    "skyBjdTdbDatetime": "SKY.BJD.TDB.DATETIME",
    "skyHjdUtcDatetime": "SKY.HJD.UTC.DATETIME",
    "skyHjdToBjdTdb": "SKY.HJD.TO.BJD.TDB",
    "skyBjdTdbToHjd": "SKY.BJD.TDB.TO.HJD",
    "skyPlanetHelioLon": "SKY.PLANET.HELIO.LON",
    "skyPlanetHelioLat": "SKY.PLANET.HELIO.LAT",
    "skyPlanetHelioDist": "SKY.PLANET.HELIO.DIST",
    "skyPlanetHelioX": "SKY.PLANET.HELIO.X",
    "skyPlanetHelioY": "SKY.PLANET.HELIO.Y",
    "skyPlanetHelioZ": "SKY.PLANET.HELIO.Z",
    "skyPlanetLon": "SKY.PLANET.LON",
    "skyPlanetLat": "SKY.PLANET.LAT",
    "skyPlanetRa": "SKY.PLANET.RA",
    "skyPlanetDec": "SKY.PLANET.DEC",
    "skyPlanetDist": "SKY.PLANET.DIST",
    "skyPlanetLighttime": "SKY.PLANET.LIGHTTIME",
    "skyPlanetElongation": "SKY.PLANET.ELONGATION",
    "skyPlanetPhaseAngle": "SKY.PLANET.PHASE.ANGLE",
    "skyPlanetIlluminated": "SKY.PLANET.ILLUMINATED",
    "skyPlanetEventNext": "SKY.PLANET.EVENT.NEXT",
    "skyEphemeris": "SKY.EPHEMERIS",
    "skyConstellation": "SKY.CONSTELLATION",
    "skyConstellationBody": "SKY.CONSTELLATION.BODY",
    "skyMeteorZhr": "SKY.METEOR.ZHR",
    "skyMeteorZhrError": "SKY.METEOR.ZHR.ERROR",
    "skyMeteorRadiantRa": "SKY.METEOR.RADIANT.RA",
    "skyMeteorRadiantDec": "SKY.METEOR.RADIANT.DEC",
    "skyVarstarPhase": "SKY.VARSTAR.PHASE",
    "skyVarstarCycle": "SKY.VARSTAR.CYCLE",
    "skyVarstarOc": "SKY.VARSTAR.OC",
    "skyVarstarMinimum": "SKY.VARSTAR.MINIMUM",
    "skyVarstarMinimumError": "SKY.VARSTAR.MINIMUM.ERROR",
    "skyPlanetMagnitude": "SKY.PLANET.MAGNITUDE",
    "skyTopoRa": "SKY.TOPO.RA",
    "skyTopoDec": "SKY.TOPO.DEC",
    "skyTopoDist": "SKY.TOPO.DIST",
    "skyTopoAlt": "SKY.TOPO.ALT",
    "skyTopoAz": "SKY.TOPO.AZ",
    "skyMoonSemidiameter": "SKY.MOON.SEMIDIAMETER",
    "skyMoonParallax": "SKY.MOON.PARALLAX",
    "skyBodyRise": "SKY.BODY.RISE",
    "skyBodySet": "SKY.BODY.SET",
    "skyBodyTransit": "SKY.BODY.TRANSIT",
    "skyStarRise": "SKY.STAR.RISE",
    "skyStarSet": "SKY.STAR.SET",
    "skyStarTransit": "SKY.STAR.TRANSIT",
    "skyWindowStart": "SKY.WINDOW.START",
    "skyWindowEnd": "SKY.WINDOW.END",
    "skyWindowHours": "SKY.WINDOW.HOURS",
    "skyWindowBest": "SKY.WINDOW.BEST",
    "skyWindowMoon": "SKY.WINDOW.MOON",
    "skyMoonSeparation": "SKY.MOON.SEPARATION",
    "skyDarkStart": "SKY.DARK.START",
    "skyDarkEnd": "SKY.DARK.END",
    "skyDarkHours": "SKY.DARK.HOURS",
    "skyOrbitFromQ": "SKY.ORBIT.FROM.Q",
    "skyOrbitFromA": "SKY.ORBIT.FROM.A",
    "skyOrbitName": "SKY.ORBIT.NAME",
    "skyOrbitAge": "SKY.ORBIT.AGE",
    "skyOrbitPeriod": "SKY.ORBIT.PERIOD",
    "skyOrbitHelioLon": "SKY.ORBIT.HELIO.LON",
    "skyOrbitHelioLat": "SKY.ORBIT.HELIO.LAT",
    "skyOrbitHelioRa": "SKY.ORBIT.HELIO.RA",
    "skyOrbitHelioDec": "SKY.ORBIT.HELIO.DEC",
    "skyOrbitSunDist": "SKY.ORBIT.SUN.DIST",
    "skyOrbitRa": "SKY.ORBIT.RA",
    "skyOrbitDec": "SKY.ORBIT.DEC",
    "skyOrbitLon": "SKY.ORBIT.LON",
    "skyOrbitLat": "SKY.ORBIT.LAT",
    "skyOrbitEarthDist": "SKY.ORBIT.EARTH.DIST",
    "skyOrbitElongation": "SKY.ORBIT.ELONGATION",
    "skyOrbitPhaseAngle": "SKY.ORBIT.PHASE.ANGLE",
    "skyOrbitRate": "SKY.ORBIT.RATE",
    "skyOrbitRatePa": "SKY.ORBIT.RATE.PA",
    "skyOrbitMag": "SKY.ORBIT.MAG",
    "skyOrbitEventNext": "SKY.ORBIT.EVENT.NEXT",
    "skyOrbitTopoRa": "SKY.ORBIT.TOPO.RA",
    "skyOrbitTopoDec": "SKY.ORBIT.TOPO.DEC",
    "skyOrbitTopoAlt": "SKY.ORBIT.TOPO.ALT",
    "skyOrbitTopoAz": "SKY.ORBIT.TOPO.AZ",
    "skyLunarEclipseNext": "SKY.LUNAR.ECLIPSE.NEXT",
    "skyLunarEclipseKind": "SKY.LUNAR.ECLIPSE.KIND",
    "skyLunarEclipseMagnitude": "SKY.LUNAR.ECLIPSE.MAGNITUDE",
    "skyLunarEclipseGamma": "SKY.LUNAR.ECLIPSE.GAMMA",
    "skyLunarEclipseDuration": "SKY.LUNAR.ECLIPSE.DURATION",
    "skyLunarEclipseMoonAlt": "SKY.LUNAR.ECLIPSE.MOON.ALT",
    "skyLunarEclipseVisibility": "SKY.LUNAR.ECLIPSE.VISIBILITY",
    "skySolarEclipseNext": "SKY.SOLAR.ECLIPSE.NEXT",
    "skySolarEclipseKind": "SKY.SOLAR.ECLIPSE.KIND",
    "skySolarEclipseGlobal": "SKY.SOLAR.ECLIPSE.GLOBAL",
    "skySolarEclipseContact": "SKY.SOLAR.ECLIPSE.CONTACT",
    "skySolarEclipseLocal": "SKY.SOLAR.ECLIPSE.LOCAL",
    "skySolarEclipseSeen": "SKY.SOLAR.ECLIPSE.SEEN",
    "skySolarEclipseDeltat": "SKY.SOLAR.ECLIPSE.DELTAT",
    "skyCrescent": "SKY.CRESCENT",
    "skyCrescentTime": "SKY.CRESCENT.TIME",
    "skyCrescentCriterion": "SKY.CRESCENT.CRITERION",
    "skyCrescentClass": "SKY.CRESCENT.CLASS",
    "skyHeliacalStar": "SKY.HELIACAL.STAR",
    "skyHeliacalPlanet": "SKY.HELIACAL.PLANET",
    "skyArcusVisionis": "SKY.ARCUS.VISIONIS",
}


def test_implementation_name_is_frozen():
    assert registry.IMPLEMENTATION_NAME == FROZEN_IMPLEMENTATION


@pytest.mark.parametrize("method", sorted(FROZEN_METHODS))
def test_frozen_method_still_declared(method):
    assert method in registry.BY_METHOD, f"{method} was removed or renamed: it is stored in sheets"


def test_every_declared_method_is_pinned():
    new = sorted(set(registry.BY_METHOD) - set(FROZEN_METHODS))
    assert not new, f"pin the new methods in FROZEN_METHODS: {new}"


def test_names_are_unique_and_well_formed():
    names = [f.name for f in registry.FUNCTIONS]
    methods = [f.method for f in registry.FUNCTIONS]
    assert len(set(names)) == len(names)
    assert len(set(m.lower() for m in methods)) == len(methods)  # ODS upper-cases them
    for f in registry.FUNCTIONS:
        assert re.fullmatch(r"SKY(\.[A-Z0-9]+)+", f.name), f.name
        assert re.fullmatch(r"sky[A-Za-z0-9]+", f.method), f.method
        for a in f.args:
            assert re.fullmatch(r"[a-z][a-z0-9_]*", a.name), a.name
            assert re.fullmatch(r"[a-z][A-Za-z0-9]*", a.idl_name), a.idl_name


@pytest.mark.parametrize("fn", registry.FUNCTIONS, ids=lambda f: f.name)
def test_every_function_and_argument_is_described(fn):
    assert len(fn.summary) > 20 and fn.summary.endswith(".")
    assert fn.result
    assert fn.family in registry.FAMILIES
    for a in fn.args:
        assert len(a.description) > 15, f"{fn.name}({a.name}) lacks a description"
        assert a.kind in registry.ROW_KINDS + registry.OPTION_KINDS + registry.SERIES_KINDS
        if a.kind == "choice":
            assert a.choices
            assert not a.optional or a.default is None or a.default in a.choices
        if a.optional:
            assert "default" in a.description.lower(), f"{fn.name}({a.name}) must state its default"


@pytest.mark.parametrize("fn", registry.FUNCTIONS, ids=lambda f: f.name)
def test_optional_arguments_come_last(fn):
    seen_optional = False
    for a in fn.args:
        if a.optional:
            seen_optional = True
        else:
            assert not seen_optional, f"{fn.name}: required {a.name} after an optional one"


@pytest.mark.parametrize("fn", registry.FUNCTIONS, ids=lambda f: f.name)
def test_time_arguments_carry_their_scale(fn):
    # The scale sits right after the (last) time argument, or, when required arguments
    # follow the time, as the first optional argument.
    names = [a.name for a in fn.args]
    if fn.has_time or "jd" in names or "mjd" in names:
        last_time = max(k for k, a in enumerate(fn.args)
                        if a.kind == "time" or a.name in ("jd", "mjd"))
        first_optional = next(k for k, a in enumerate(fn.args) if a.optional)
        assert "scale" in names
        assert names.index("scale") in (last_time + 1, first_optional), fn.name


@pytest.mark.parametrize("fn", registry.FUNCTIONS, ids=lambda f: f.name)
def test_models_state_their_validity(fn):
    if fn.has_time and any(a.name in ("model", "nutation") for a in fn.args):
        assert re.search(r"\d{3,4}", fn.model) and ("valid" in fn.description.lower()
                                                    or "outside" in fn.description.lower())


@pytest.mark.parametrize("fn", registry.FUNCTIONS, ids=lambda f: f.name)
def test_impl_resolves_and_takes_the_arguments(fn):
    module, name = fn.impl.split(":")
    func = getattr(importlib.import_module(f"calcfuncs.{module}"), name)
    params = inspect.signature(func).parameters
    consumed_by_time_reader = {"scale", "dut1"} if fn.has_time else set()
    for a in fn.args:
        if a.name in consumed_by_time_reader:
            continue
        assert a.name in params, f"{fn.impl} does not take {a.name}"


def test_generated_files_are_current():
    stale = build.stale_files()
    assert not stale, f"regenerate with `make generate`: {stale}"


def test_wizard_texts_cover_every_argument():
    xcu = build.xcu_text()
    for fn in registry.FUNCTIONS:
        assert f'oor:name="{fn.method}"' in xcu
        for a in fn.args:
            assert f'oor:name="{a.idl_name}"' in xcu


def test_the_wizard_says_required_first_and_optional_last():
    # Calc's wizard marks every parameter of UNO type ``any`` "(optional)" on its own
    # (sc/source/core/tool/addincol.cxx, read in LibreOffice's source), and all of ours
    # are ``any`` (next test), so the words must carry the difference: read back from the
    # generated xcu, as the office reads it.
    from xml.etree import ElementTree

    ns = "{http://openoffice.org/2001/registry}"
    root = ElementTree.fromstring(build.xcu_text())
    functions = root.find(f".//node[@{ns}name='AddInFunctions']")
    texts = {}
    for fnode in functions:
        for pnode in fnode.find(f"node[@{ns}name='Parameters']"):
            desc = pnode.find(f"prop[@{ns}name='Description']/value").text
            texts[fnode.get(f"{ns}name"), pnode.get(f"{ns}name")] = desc
    required = optional = 0
    for fn in registry.FUNCTIONS:
        for a in fn.args:
            text = texts[fn.method, a.idl_name]
            if a.optional:
                optional += 1
                assert not text.startswith("Required"), (fn.name, a.name)
                assert text.endswith("(optional)"), (fn.name, a.name)
            else:
                required += 1
                assert text.startswith("Required. "), (fn.name, a.name)
                assert "(optional)" not in text, (fn.name, a.name)
    # SKY.JD(time; [scale]; [result_scale]; [dut1]): the case the issue saw wrong.
    assert texts["skyJd", "time"].startswith("Required. The instant")
    assert texts["skyJd", "scale"].endswith("(optional)")
    assert required > 50 and optional > 50


def test_every_cell_argument_is_an_any_so_calc_never_refuses_it():
    # A typed parameter (double, string, an array) would be "required" to Calc, which
    # then answers an omitted argument with an Err:5xx instead of our #SKY: message.
    idl = build.idl_text()
    for fn in registry.FUNCTIONS:
        params = re.search(rf"{fn.method}\(([^)]*)\)", idl).group(1).split(",")[1:]
        assert all(p.split()[1] == "any" for p in params), fn.method


def test_idl_declares_every_method_with_hidden_settings_first():
    idl = build.idl_text()
    for fn in registry.FUNCTIONS:
        m = re.search(rf"{fn.method}\(([^)]*)\)", idl)
        assert m, fn.method
        params = [p.strip() for p in m.group(1).split(",")]
        assert params[0].endswith("XPropertySet docSettings")
        assert [p.split()[-1] for p in params[1:]] == [a.idl_name for a in fn.args]


def test_core_package_never_imports_the_office_bridge():
    core = os.path.join(ROOT, "calcfuncs")
    checked = 0
    for dirpath, _, files in os.walk(core):
        for name in files:
            if name.endswith(".py"):
                text = open(os.path.join(dirpath, name), encoding="utf-8").read()
                assert not re.search(r"^\s*(import|from)\s+uno\b", text, re.M), name
                checked += 1
    assert checked > 20  # the registry's modules included


def test_registry_import_is_light():
    # The adapter imports the registry when the office loads the component; numpy
    # must not come with it, or a missing numpy would break the install.
    code = (
        "import sys; import calcfuncs.registry; "
        "sys.exit(1 if 'numpy' in sys.modules or 'erfa' in sys.modules else 0)"
    )
    import subprocess

    done = subprocess.run([sys.executable, "-c", code], cwd=ROOT)
    assert done.returncode == 0


# The frozen methods in the order the interface has always declared them (the IDL, the
# xcu and the reference follow it).  New functions may come anywhere; these keep their
# order relative to each other.
DECLARED_ORDER = (
    "skyJd skyMjd skyDatetime skyJdDatetime skyMjdDatetime skyTextIso skyDeltaT "
    "skyDeltaTUncertainty skyLeapseconds skyLeapsecondsUntil skyTextDate skyAngle "
    "skyAngleHours skyTextDms skyTextHms skyWrap360 skyWrap180 skyObliquity "
    "skyObliquityTrue skyNutationLon skyNutationObl skyVersion skyCoordLon skyCoordLat "
    "skyCoordX skyCoordY skyCoordZ skyRectLon skyRectLat skyRectDist skyPrecessRa "
    "skyPrecessDec skyProperRa skyProperDec skySeparation skyPositionAngle skySidereal "
    "skyHourangle skyHorizonAlt skyHorizonAz skyHorizonRa skyHorizonDec skyParallactic "
    "skyAirmass skySunLon skySunLat skySunRa skySunDec skySunDist skySunSolarlon "
    "skySunEqtime skySunSundial skySeason skySeasonLength skySunReaches skySunRise "
    "skySunSet skySunDaylength skySunTransit skySunElongation skySunRelativeLon "
    "skySunRelativeLat skyMoonLon skyMoonLat skyMoonRa skyMoonDec skyMoonDist "
    "skyMoonElongation skyMoonPhaseAngle skyMoonIlluminated skyMoonAge skyMoonNode "
    "skyMoonPhaseNext skyEclipseNodeDistance skyEclipsePossible skyBjdTdb skyHjdUtc "
    "skyHjdTt skyBjdTdbDatetime skyHjdUtcDatetime skyHjdToBjdTdb skyBjdTdbToHjd "
    "skyPlanetHelioLon skyPlanetHelioLat skyPlanetHelioDist skyPlanetHelioX "
    "skyPlanetHelioY skyPlanetHelioZ skyPlanetLon skyPlanetLat skyPlanetRa skyPlanetDec "
    "skyPlanetDist skyPlanetLighttime skyPlanetElongation skyPlanetPhaseAngle "
    "skyPlanetIlluminated skyPlanetEventNext skyEphemeris "
    "skyConstellation skyConstellationBody skyMeteorZhr skyMeteorZhrError "
    "skyMeteorRadiantRa skyMeteorRadiantDec skyVarstarPhase skyVarstarCycle skyVarstarOc "
    "skyVarstarMinimum skyVarstarMinimumError skyPlanetMagnitude "
    "skyTopoRa skyTopoDec skyTopoDist skyTopoAlt skyTopoAz skyMoonSemidiameter skyMoonParallax skyBodyRise skyBodySet skyBodyTransit skyStarRise "
    "skyStarSet skyStarTransit skyWindowStart skyWindowEnd skyWindowHours skyWindowBest skyWindowMoon skyMoonSeparation skyDarkStart skyDarkEnd skyDarkHours "
    "skyOrbitFromQ skyOrbitFromA skyOrbitName skyOrbitAge skyOrbitPeriod skyOrbitHelioLon "
    "skyOrbitHelioLat skyOrbitHelioRa skyOrbitHelioDec skyOrbitSunDist skyOrbitRa "
    "skyOrbitDec skyOrbitLon skyOrbitLat skyOrbitEarthDist skyOrbitElongation "
    "skyOrbitPhaseAngle skyOrbitRate skyOrbitRatePa skyOrbitMag skyOrbitEventNext "
    "skyOrbitTopoRa skyOrbitTopoDec skyOrbitTopoAlt skyOrbitTopoAz "
    "skyLunarEclipseNext skyLunarEclipseKind skyLunarEclipseMagnitude skyLunarEclipseGamma "
    "skyLunarEclipseDuration skyLunarEclipseMoonAlt skyLunarEclipseVisibility "
    "skySolarEclipseNext skySolarEclipseKind skySolarEclipseGlobal skySolarEclipseContact "
    "skySolarEclipseLocal skySolarEclipseSeen skySolarEclipseDeltat "
    "skyCrescent skyCrescentTime skyCrescentCriterion skyCrescentClass "
    "skyHeliacalStar skyHeliacalPlanet skyArcusVisionis"
).split()


def test_the_declared_order_is_kept():
    assert sorted(DECLARED_ORDER) == sorted(FROZEN_METHODS)
    declared = [f.method for f in registry.FUNCTIONS if f.method in FROZEN_METHODS]
    assert declared == DECLARED_ORDER


def test_each_family_is_said_once_and_lists_its_functions_together():
    assert list(registry.FAMILIES) == [f.name for f in registry.FAMILY_ORDER]
    seen = []
    for fn in registry.FUNCTIONS:
        if not seen or seen[-1] != fn.family:
            assert fn.family not in seen, f"{fn.name}: family {fn.family} is split"
            seen.append(fn.family)
    for family in registry.FAMILY_ORDER:
        assert family.functions and all(f.family == family.name for f in family.functions)
    assert sum(len(f.functions) for f in registry.FAMILY_ORDER) == len(registry.FUNCTIONS)


@pytest.mark.parametrize("fn", registry.FUNCTIONS, ids=lambda f: f.name)
def test_the_result_kind_is_what_the_words_say(fn):
    # The kind drives the adapter, the cells and the API; the words are what the user
    # reads.  They must not disagree.
    assert fn.result_kind in registry.RESULT_KINDS
    says_datetime = "date-time value" in fn.result
    says_text = fn.result.startswith("text")
    assert says_datetime == (fn.result_kind == "datetime"), fn.result
    assert says_text == (fn.result_kind == "text"), fn.result
    assert fn.returns_text == (fn.result_kind == "text")
    if fn.result_kind == "datetime":
        assert fn.uses_null_date  # the adapter reads the document's null date for it


def test_result_kinds_of_known_functions():
    kinds = {f.name: f.result_kind for f in registry.FUNCTIONS}
    assert kinds["SKY.JD"] == "number"
    assert kinds["SKY.SEASON"] == "datetime"  # a year in, a date-time value out
    assert kinds["SKY.SUN.RISE"] == "datetime"  # words where the Sun does not rise
    assert kinds["SKY.TEXT.ISO"] == kinds["SKY.VERSION"] == "text"
    assert sorted(n for n, k in kinds.items() if k == "text") == [
        "SKY.CONSTELLATION", "SKY.CONSTELLATION.BODY", "SKY.CRESCENT.CLASS",
        "SKY.ECLIPSE.POSSIBLE", "SKY.EPHEMERIS", "SKY.LUNAR.ECLIPSE.KIND",
        "SKY.LUNAR.ECLIPSE.VISIBILITY", "SKY.ORBIT.FROM.A", "SKY.ORBIT.FROM.Q", "SKY.ORBIT.NAME",
        "SKY.SOLAR.ECLIPSE.KIND", "SKY.SOLAR.ECLIPSE.SEEN", "SKY.TEXT.DATE", "SKY.TEXT.DMS",
        "SKY.TEXT.HMS", "SKY.TEXT.ISO", "SKY.VERSION"]


def test_every_argument_has_a_noun_for_its_messages():
    for fn in registry.FUNCTIONS:
        for a in fn.args:
            assert a.noun and a.name.replace("_", " ") in a.noun.replace("_", " ") \
                or a.name == "nutation", (fn.name, a.name, a.noun)
    nutation = registry.BY_NAME["SKY.OBLIQUITY.TRUE"].args[3]
    assert (nutation.name, nutation.noun) == ("nutation", "nutation model")


def test_no_declaration_rebinds_or_reads_another():
    # The registry reads like a table: no FUNCTIONS = FUNCTIONS + ..., no declaration
    # built from its neighbour (FUNCTIONS[-1]), no family= repeated per function.
    folder = os.path.join(ROOT, "calcfuncs", "registry")
    for name in sorted(os.listdir(folder)):
        if not name.endswith(".py"):
            continue
        text = open(os.path.join(folder, name), encoding="utf-8").read()
        assert not re.search(r"^(\w+) = \1 \+", text, re.M), name
        assert not re.search(r"FUNCTIONS\[-?\d+\]|functions\[-?\d+\]", text), name
        assert "family=" not in text.replace("family=self.name", ""), name
