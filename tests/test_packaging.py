"""The .oxt as a package: the self-contained build and the extension's metadata.

The office tests here install into fresh office profiles with ``unopkg`` (as
``officekit`` does everywhere) and compute cells in a real headless LibreOffice.  The
self-contained build's wheels are downloaded once (PyPI) and kept under build/wheels/.
"""

import json
import os
import shutil
import struct
import subprocess
import sys
import tempfile
import textwrap
import xml.etree.ElementTree as ET
import zipfile

import pytest

import calcfuncs
from calcfuncs import registry

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
BUILD = os.path.join(ROOT, "extension", "build.py")
sys.path.insert(0, os.path.join(ROOT, "extension"))
import build  # noqa: E402
import bundle  # noqa: E402

DESCRIPTION_NS = {"d": "http://openoffice.org/extensions/description/2006",
                  "lo": "http://libreoffice.org/extensions/description/2011"}
XLINK_HREF = "{http://www.w3.org/1999/xlink}href"
# The J2000.0 epoch, 2000-01-01 12:00:00 TT, is 11:58:55.816 UTC (TT - UTC = 64.184 s
# then: 32 leap seconds + 32.184 s); JD(TT) 2451545.0. Common practice.
J2000_UTC_CELL = '=SKY.JD("2000-01-01T11:58:55.816Z";"UTC";"TT")'
J2000_JD_TT = 2451545.0
# IAU 2006 mean obliquity at J2000.0: 84381.406 arcseconds (Hilton et al. 2006; IERS
# Conventions 2010, eq. 5.40; value from memory).
OBLIQUITY_CELL = '=SKY.OBLIQUITY("2000-01-01T12:00:00";"TT";"IAU2006";"ARCSEC")'
OBLIQUITY_J2000_ARCSEC = 84381.406

# Asked inside the office's own Python, through its Python script provider: where the
# modules that computed the cells were loaded from, and the module search path.
PROBE_SCRIPT = textwrap.dedent('''\
    import json
    import sys


    def loaded_from(*args):
        return json.dumps({
            "modules": {name: getattr(sys.modules.get(name), "__file__", None)
                        for name in ("numpy", "erfa", "calcfuncs")},
            "path": sys.path,
        })


    g_exportedScripts = (loaded_from,)
''')
PROBE_URI = ("vnd.sun.star.script:eclipsheet_probe.py$loaded_from"
             "?language=Python&location=user")


def _build(*args):
    done = subprocess.run([sys.executable, BUILD, "oxt", *args], capture_output=True,
                          text=True)
    assert done.returncode == 0, done.stdout + done.stderr
    return done.stdout.strip().splitlines()[-1]


def _compute(office, formulas):
    doc = office.new_sheet()
    try:
        sheet = doc.Sheets.getByIndex(0)
        for row, formula in enumerate(formulas):
            sheet.getCellByPosition(0, row).setFormula(formula)
        doc.calculateAll()
        cells = [sheet.getCellByPosition(0, row) for row in range(len(formulas))]
        return [(c.getError(), c.getValue(), c.getString()) for c in cells]
    finally:
        doc.close(True)


def _listed(profile):
    """(identifier, version) of every extension ``unopkg list`` shows in the profile."""
    import officekit

    out = officekit.unopkg(profile, "list").stdout
    found, identifier = [], None
    for line in out.splitlines():
        line = line.strip()
        if line.startswith("Identifier:"):
            identifier = line.split(":", 1)[1].strip()
        elif line.startswith("Version:") and identifier:
            found.append((identifier, line.split(":", 1)[1].strip()))
            identifier = None
    return found


@pytest.fixture
def profile():
    """A fresh office profile outside pytest's tmp_path: when the tests run as root,
    officekit installs as the unprivileged 'nobody', who cannot enter tmp_path."""
    path = tempfile.mkdtemp(prefix="eclipsheet-profile-")
    yield path
    shutil.rmtree(path, ignore_errors=True)


# ---- the self-contained build in an office without numpy and erfa --------------------


@pytest.fixture(scope="module")
def bundled_oxt(tmp_path_factory):
    """The self-contained build for this machine's office (its Python's version and
    platform, read from that Python by the build)."""
    return _build("--bundle", str(tmp_path_factory.mktemp("bundle") / "bundled.oxt"))


def _shadow_packages(folder):
    """numpy and erfa packages that refuse to import, as a Python without them does.

    Why this stands in faithfully for an office Python that has no numpy or erfa: the
    folder goes on PYTHONPATH, which the interpreter places ahead of its own
    site-packages, so every ``import numpy`` or ``import erfa`` that reaches the normal
    search path meets these first and fails with the same ImportError as a missing
    package (Python does not go on to the next folder after a package fails); the
    system's numpy 1.24 and erfa behind them cannot be reached by name.  The
    extension's pythonpath/ is appended by the office *behind* both, so the build only
    passes if it really finds its own copies first (the adapter's job), and the probe
    below checks the loaded files' folders.  A meta-path blocker would also have worked,
    but would need a sitecustomize hook in the office's interpreter; this needs nothing
    but the environment of the office process."""
    for name in ("numpy", "erfa"):
        package = folder / name
        package.mkdir(parents=True)
        (package / "__init__.py").write_text(
            f"raise ImportError(\"No module named '{name}'\", name='{name}')\n"
        )
    return str(folder)


@pytest.mark.office
def test_self_contained_build_computes_where_the_office_has_no_numpy(bundled_oxt, profile,
                                                                     tmp_path):
    import officekit

    names = zipfile.ZipFile(bundled_oxt).namelist()
    assert "pythonpath/numpy/__init__.py" in names
    assert "pythonpath/erfa/__init__.py" in names
    description = ET.fromstring(zipfile.ZipFile(bundled_oxt).read("description.xml"))
    # This machine's office reports linux_x86_64 and installs only a build for it.
    assert description.find("d:platform", DESCRIPTION_NS).get("value") == "linux_x86_64"

    shadow = _shadow_packages(tmp_path / "shadow")
    scripts = os.path.join(profile, "user", "Scripts", "python")
    os.makedirs(scripts)
    with open(os.path.join(scripts, "eclipsheet_probe.py"), "w", encoding="utf-8") as f:
        f.write(PROBE_SCRIPT)


    with officekit.Office(oxt=bundled_oxt, profile=profile,
                          env={"PYTHONPATH": shadow}) as office:
        (jd_err, jd, _), (eps_err, eps, _), (_, _, version) = _compute(
            office, [J2000_UTC_CELL, OBLIQUITY_CELL, "=SKY.VERSION()"]
        )
        factory = office.service("com.sun.star.script.provider.MasterScriptProviderFactory")
        script = factory.createScriptProvider("").getScript(PROBE_URI)
        probe = json.loads(script.invoke((), (), ())[0])

    assert jd_err == 0 and abs(jd - J2000_JD_TT) < 1e-9, (jd, version)
    # 1e-6" is far below the formula's own rounding of its constant term.
    assert eps_err == 0 and abs(eps - OBLIQUITY_J2000_ARCSEC) < 1e-6, eps
    pins = bundle.pinned_versions()
    assert f"numpy {pins['numpy']}" in version, version

    extension_path = [p for p in probe["path"] if p.endswith(os.sep + "pythonpath")
                      and p.startswith(profile)]
    assert len(extension_path) == 1, probe["path"]
    own = extension_path[0]
    for name in ("numpy", "erfa", "calcfuncs"):
        loaded = probe["modules"][name]
        assert loaded and loaded.startswith(own + os.sep + name + os.sep), (name, loaded)
    # The shadow stood in front of the system's site-packages the whole time.
    dist = [i for i, p in enumerate(probe["path"]) if p.endswith("dist-packages")]
    assert probe["path"].index(shadow) < min(dist), probe["path"]


@pytest.mark.office  # builds an .oxt: needs the office's SDK and Python
def test_bundle_signs_every_compiled_module_before_zipping(tmp_path):
    """--codesign runs codesign on each .so/.dylib that goes into the .oxt.  Apple's
    codesign is not on this machine: a stand-in on PATH marks each file it is given, and
    every compiled module in the built .oxt must carry the mark.  What macOS then
    accepts is not tested here."""
    tools = tmp_path / "bin"
    tools.mkdir()
    fake = tools / "codesign"
    fake.write_text('#!/bin/sh\nfor last; do :; done\nprintf "SIGNED:%s" "$3" >> "$last"\n')
    fake.chmod(0o755)
    target = tmp_path / "signed.oxt"
    platform, python_version = bundle.machine_target(build.find_office())
    env = dict(os.environ, PATH=f"{tools}{os.pathsep}{os.environ['PATH']}")
    done = subprocess.run(
        [sys.executable, BUILD, "oxt", "--bundle", "--platform", platform,
         "--python-version", python_version, "--codesign", "-", str(target)],
        capture_output=True, text=True, env=env,
    )
    assert done.returncode == 0, done.stdout + done.stderr
    with zipfile.ZipFile(target) as z:
        compiled = [n for n in z.namelist() if n.endswith(".so") or ".so." in n]
        assert len(compiled) > 5
        for name in compiled:
            if name.endswith(".so"):
                assert z.read(name).endswith(b"SIGNED:-"), name
    assert f"signed {sum(n.endswith('.so') for n in compiled)} compiled modules" in done.stdout


@pytest.mark.parametrize("sysconfig_platform,glibc,wheel_tag,office_token", [
    # PEP 600 (glibc version in the tag) and PEP 425 platform tags; the office token is
    # description.xml's platform value, linux_x86_64 as this machine's office checks it.
    ("linux-x86_64", "glibc 2.36", "manylinux_2_36_x86_64", "linux_x86_64"),
    ("linux-aarch64", "glibc 2.31", "manylinux_2_31_aarch64", "linux_aarch64"),
    ("win-amd64", "", "win_amd64", "windows_x86_64"),
    ("macosx-11.0-arm64", "", "macosx_11_0_arm64", "macosx_aarch64"),
    ("macosx-10.13-x86_64", "", "macosx_10_13_x86_64", "macosx_x86_64"),
])
def test_platform_tags(sysconfig_platform, glibc, wheel_tag, office_token):
    assert bundle.wheel_platform(sysconfig_platform, glibc) == wheel_tag
    assert bundle.office_platform_token(wheel_tag) == office_token


def test_a_glibc_tag_also_takes_older_manylinux_wheels():
    # numpy 2.4's Linux wheels are manylinux_2_27/2_28, pyerfa's manylinux2014 (2_17).
    tags = bundle.pip_platforms("manylinux_2_36_x86_64")
    assert tags[0] == "manylinux_2_36_x86_64"
    assert "manylinux_2_28_x86_64" in tags and "manylinux_2_17_x86_64" in tags
    assert tags[-1] == "manylinux2014_x86_64"
    assert bundle.pip_platforms("win_amd64") == ["win_amd64"]


# ---- metadata and upgrading over an older version -------------------------------------


@pytest.mark.office  # builds an .oxt: needs the office's SDK
def test_description_carries_the_metadata(oxt):
    with zipfile.ZipFile(oxt) as z:
        root = ET.fromstring(z.read("description.xml"))
        names = set(z.namelist())

        def href(path):
            element = root.find(path, DESCRIPTION_NS)
            assert element is not None, path
            assert element.get(XLINK_HREF) in names, path
            return z.read(element.get(XLINK_HREF))

        assert root.find("d:version", DESCRIPTION_NS).get("value") == calcfuncs.__version__
        assert root.find("d:identifier", DESCRIPTION_NS).get("value") == registry.EXTENSION_IDENTIFIER
        publisher = root.find("d:publisher/d:name", DESCRIPTION_NS)
        assert publisher.text == "Eclipsheet contributors" and XLINK_HREF not in publisher.attrib
        minimal = root.find("d:dependencies/lo:LibreOffice-minimal-version", DESCRIPTION_NS)
        assert minimal.get("value") == "7.4"
        licence = root.find("d:registration/d:simple-license", DESCRIPTION_NS)
        assert licence.get("accept-by") == "admin" and licence.get("suppress-on-update") == "true"
        with open(os.path.join(ROOT, "LICENSE"), "rb") as f:
            assert href("d:registration/d:simple-license/d:license-text") == f.read()
        png = href("d:icon/d:default")
        # PNG signature and IHDR (ISO/IEC 15948): 42 x 42, 8-bit RGBA.
        assert png[:8] == b"\x89PNG\r\n\x1a\n" and png[12:16] == b"IHDR"
        assert struct.unpack(">IIBB", png[16:26]) == (42, 42, 8, 6)
        notes = href("d:release-notes/d:src").decode("utf-8")
        assert notes.splitlines()[0] == f"Eclipsheet {calcfuncs.__version__}"
        assert href("d:extension-description/d:src").strip()


@pytest.mark.office
def test_adding_the_current_version_over_an_older_one_upgrades_it(oxt, profile, tmp_path):
    import officekit

    older = _build("--version", "0.0.9", str(tmp_path / "eclipsheet-0.0.9.oxt"))
    with zipfile.ZipFile(older) as z:
        assert '__version__ = "0.0.9"' in z.read("pythonpath/calcfuncs/__init__.py").decode()
    officekit.install_extension(older, profile)
    assert _listed(profile) == [(registry.EXTENSION_IDENTIFIER, "0.0.9")]

    current = str(tmp_path / f"eclipsheet-{calcfuncs.__version__}.oxt")
    shutil.copyfile(oxt, current)
    officekit.install_extension(current, profile)
    assert _listed(profile) == [(registry.EXTENSION_IDENTIFIER, calcfuncs.__version__)]

    with officekit.Office(profile=profile) as office:
        (err, jd, _), (_, _, version) = _compute(office, [J2000_UTC_CELL, "=SKY.VERSION()"])
    assert err == 0 and abs(jd - J2000_JD_TT) < 1e-9
    # The code that runs is the new build's, not a cached copy of the old one.
    assert version.startswith(f"Eclipsheet {calcfuncs.__version__};"), version
