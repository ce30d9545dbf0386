"""Generate the add-in's files from the registry and build ``dist/eclipsheet.oxt``.

    python3 extension/build.py generate   # rewrite the committed generated files
    python3 extension/build.py check      # exit 1 if any generated file is stale
    python3 extension/build.py oxt        # generate, compile the type library, zip

Generated from ``calcfuncs/registry.py`` alone: the IDL, ``CalcAddIns.xcu`` (Function
Wizard texts), the ``.components`` file, ``description.xml``, the manifest and
``docs/functions.md``.  The type library is compiled with the SDK's ``unoidl-write``.
"""

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

GENERATED = os.path.join(HERE, "generated")
ADAPTER = "eclipsheet_addin.py"
RDB_NAME = "eclipsheet.rdb"
COMPONENTS_NAME = "eclipsheet.components"
OFFICE_DIRS = ("/usr/lib/libreoffice", "/opt/libreoffice", "/usr/local/lib/libreoffice")


# ---- the generated texts --------------------------------------------------------------


def idl_text():
    mod = registry.INTERFACE_MODULE
    lines = [
        "// Generated from calcfuncs/registry.py by extension/build.py: do not edit.",
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
        lines.append(f"    sequence< sequence< any > > {fn.method}({', '.join(params)});")
    lines += ["};", "", " ".join("};" for _ in mod), ""]
    return "\n".join(lines)


def _value(text, lang="en"):
    return f'<value xml:lang="{lang}">{escape(text)}</value>'


def _wizard_arg_text(arg):
    return arg.description if not arg.optional else arg.description + " (optional)"


def xcu_text():
    out = [
        '<?xml version="1.0" encoding="UTF-8"?>',
        "<!-- Generated from calcfuncs/registry.py by extension/build.py: do not edit. -->",
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
                f'       <prop oor:name="Description">{_value(_wizard_arg_text(a))}</prop>',
                "      </node>",
            ]
        out += ["     </node>", "    </node>"]
    out += ["   </node>", "  </node>", " </node>", "</oor:component-data>", ""]
    return "\n".join(out)


def components_text():
    services = "".join(f'\n      <service name="{s}"/>' for s in registry.SERVICE_NAMES)
    return (
        '<?xml version="1.0" encoding="UTF-8"?>\n'
        "<!-- Generated from calcfuncs/registry.py by extension/build.py: do not edit. -->\n"
        '<components xmlns="http://openoffice.org/2010/uno-components">\n'
        f'  <component loader="com.sun.star.loader.Python" uri="{ADAPTER}">\n'
        f'    <implementation name="{registry.IMPLEMENTATION_NAME}">{services}\n'
        "    </implementation>\n"
        "  </component>\n"
        "</components>\n"
    )


def description_text():
    return (
        '<?xml version="1.0" encoding="UTF-8"?>\n'
        "<!-- Generated from calcfuncs/registry.py by extension/build.py: do not edit. -->\n"
        '<description xmlns="http://openoffice.org/extensions/description/2006"\n'
        '             xmlns:d="http://openoffice.org/extensions/description/2006"\n'
        '             xmlns:lo="http://libreoffice.org/extensions/description/2011"\n'
        '             xmlns:xlink="http://www.w3.org/1999/xlink">\n'
        f'  <identifier value="{registry.EXTENSION_IDENTIFIER}"/>\n'
        f'  <version value="{__version__}"/>\n'
        "  <display-name>\n"
        '    <name lang="en">Eclipsheet: astronomy cell functions (SKY.*)</name>\n'
        "  </display-name>\n"
        '  <platform value="all"/>\n'
        "  <dependencies>\n"
        '    <lo:LibreOffice-minimal-version d:name="LibreOffice 7.0" value="7.0"/>\n'
        "  </dependencies>\n"
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
        "Generated from `calcfuncs/registry.py` by `extension/build.py`: do not edit.",
        "",
        "Every function accepts a range in any argument and then returns an array of the "
        "same shape (enter it as an array formula, Ctrl+Shift+Enter); single cells in "
        "other arguments apply to every row. Angles are decimal degrees. Problems show "
        "as text starting with `#SKY:` in the cell.",
        "",
        f"Stored in ODS files as `{registry.IMPLEMENTATION_NAME.upper()}.<METHOD>`; the "
        "method names below never change.",
        "",
    ]
    for family, title in registry.FAMILIES.items():
        out += [f"## {title}", ""]
        for fn in registry.FUNCTIONS:
            if fn.family != family:
                continue
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
                out.append(f"| `{a.name}` | {_md_escape(_wizard_arg_text(a))} |")
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
    }


def stale_files():
    """Paths whose committed text differs from what the registry generates."""
    stale = []
    for rel, text in generated_files().items():
        path = os.path.join(ROOT, rel)
        try:
            with open(path, encoding="utf-8") as f:
                if f.read() != text:
                    stale.append(rel)
        except FileNotFoundError:
            stale.append(rel)
    return stale


def write_generated():
    for rel, text in generated_files().items():
        path = os.path.join(ROOT, rel)
        os.makedirs(os.path.dirname(path), exist_ok=True)
        with open(path, "w", encoding="utf-8") as f:
            f.write(text)


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


def build_oxt(target):
    write_generated()
    with tempfile.TemporaryDirectory() as tmp:
        rdb = os.path.join(tmp, RDB_NAME)
        compile_rdb(os.path.join(GENERATED, "XSkyFunctions.idl"), rdb)
        os.makedirs(os.path.dirname(os.path.abspath(target)), exist_ok=True)
        partial = target + ".part"
        with zipfile.ZipFile(partial, "w", zipfile.ZIP_DEFLATED) as z:
            z.write(os.path.join(GENERATED, "manifest.xml"), "META-INF/manifest.xml")
            z.write(os.path.join(GENERATED, "description.xml"), "description.xml")
            z.write(os.path.join(GENERATED, COMPONENTS_NAME), COMPONENTS_NAME)
            z.write(os.path.join(GENERATED, "CalcAddIns.xcu"), "CalcAddIns.xcu")
            z.write(rdb, f"types/{RDB_NAME}")
            z.write(os.path.join(HERE, ADAPTER), ADAPTER)
            core = os.path.join(ROOT, "calcfuncs")
            for name in sorted(os.listdir(core)):
                if name.endswith(".py"):
                    z.write(os.path.join(core, name), f"pythonpath/calcfuncs/{name}")
        os.replace(partial, target)
    return target


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
        target = argv[2] if len(argv) > 2 else os.path.join(ROOT, "dist", "eclipsheet.oxt")
        print(build_oxt(target))
    else:
        print(__doc__)
        return 2
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
