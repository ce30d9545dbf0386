"""numpy and pyerfa wheels for a self-contained .oxt: which ones, fetched once, unpacked.

The office runs our component in its own Python.  On Windows and macOS that Python is
bundled with the office and has neither pip nor numpy, so a self-contained build carries
numpy and pyerfa inside the extension's ``pythonpath/``.  Compiled wheels only import in
the interpreter they were built for, so the build is for one wheel platform tag and one
office Python version (``3.11``), never "any".

The wheels come from ``pip download --only-binary=:all: --no-deps`` for that platform and
version and are kept under ``build/wheels/`` so that a rebuild needs no network.
"""

import os
import re
import shutil
import subprocess
import sys
import zipfile

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
WHEEL_CACHE = os.path.join(ROOT, "build", "wheels")
PINS_FILE = os.path.join(ROOT, "requirements-dev.txt")
# Distribution names; pyerfa installs the package erfa.  jplephem (pure Python) is what
# the cells read JPL kernels with, so a bundled office can use source DE440 or a .bsp.
BUNDLED = ("numpy", "pyerfa", "jplephem")

# What the office's Python reports about itself, read by running it.
_PROBE = (
    "import os, sys, sysconfig; "
    "glibc = os.confstr('CS_GNU_LIBC_VERSION') if hasattr(os, 'confstr') else ''; "
    "print('%d.%d' % sys.version_info[:2]); print(sysconfig.get_platform()); print(glibc or '')"
)


def pinned_versions(path=PINS_FILE):
    """The numpy and pyerfa versions the tests run with (requirements-dev.txt): the
    bundle carries the same ones unless told otherwise."""
    pins = {}
    with open(path, encoding="utf-8") as f:
        for line in f:
            name, _, version = line.split("#")[0].strip().partition("==")
            if name.lower() in BUNDLED and version:
                pins[name.lower()] = version
    missing = [n for n in BUNDLED if n not in pins]
    if missing:
        raise SystemExit(f"{path} pins no version of {', '.join(missing)}")
    return pins


def office_python(office_dir):
    """The interpreter the office runs components in.  An office from The Document
    Foundation's installers brings its own (``program/python``); a distribution's office
    (Debian, Ubuntu) uses the system's ``/usr/bin/python3``.  ``OFFICE_PYTHON`` overrides."""
    if os.environ.get("OFFICE_PYTHON"):
        return os.environ["OFFICE_PYTHON"]
    for name in ("python", "python.exe"):
        candidate = os.path.join(office_dir, "program", name)
        if os.path.isfile(candidate):
            return candidate
    return "/usr/bin/python3"


def wheel_platform(sysconfig_platform, glibc):
    """pip's platform tag for a ``sysconfig.get_platform()`` value: linux-x86_64 with
    glibc 2.36 -> manylinux_2_36_x86_64 (PEP 600), win-amd64 -> win_amd64,
    macosx-11.0-arm64 -> macosx_11_0_arm64."""
    if sysconfig_platform.startswith("linux-"):
        found = re.match(r"glibc (\d+)\.(\d+)", glibc or "")
        if not found:
            raise SystemExit("not a glibc Linux: give --platform explicitly")
        arch = sysconfig_platform.split("-", 1)[1]
        return f"manylinux_{found.group(1)}_{found.group(2)}_{arch}"
    return re.sub(r"[-.]", "_", sysconfig_platform)


def machine_target(office_dir):
    """(wheel platform, "X.Y") of this machine's office, read from its own Python."""
    python = office_python(office_dir)
    done = subprocess.run([python, "-c", _PROBE], capture_output=True, text=True, check=True)
    version, sysplat, glibc = (done.stdout.splitlines() + ["", "", ""])[:3]
    return wheel_platform(sysplat, glibc), version


def pip_platforms(platform):
    """pip accepts a wheel only for the exact platform tags it is given, and widens only
    the old manylinux2014/2010 and macOS names itself; a PEP 600 ``manylinux_2_N`` tag
    also accepts every older glibc down to 2.17 (where manylinux2014 sits)."""
    found = re.fullmatch(r"manylinux_2_(\d+)_(\w+)", platform)
    if not found:
        return [platform]
    newest, arch = int(found.group(1)), found.group(2)
    return [f"manylinux_2_{n}_{arch}" for n in range(newest, 16, -1)] + [f"manylinux2014_{arch}"]


def office_platform_token(platform):
    """The description.xml platform token for a wheel platform tag, so that the office
    refuses to install a build made for another system.  The office forms its own
    token from its operating system and processor names (linux_x86_64 seen here on
    Debian; the Windows and macOS tokens follow the same pattern, untested here)."""
    cpu = {"amd64": "x86_64", "x86_64": "x86_64", "arm64": "aarch64", "aarch64": "aarch64",
           "win32": "x86", "i686": "x86"}
    arch = "x86_64" if platform.endswith("x86_64") else platform.rsplit("_", 1)[-1]
    if arch == "universal2":
        raise SystemExit("name the office's own processor: macosx_..._arm64 or _x86_64")
    if platform.startswith(("manylinux", "musllinux")):
        return "linux_" + cpu.get(arch, arch)
    if platform == "win32":
        return "windows_x86"
    if platform.startswith("win_"):
        return "windows_" + cpu.get(arch, arch)
    if platform.startswith("macosx_"):
        return "macosx_" + cpu.get(arch, arch)
    raise SystemExit(f"no office platform known for wheel platform {platform!r}")


def _cached(folder, dist, version):
    prefix = f"{dist}-{version}-"
    if not os.path.isdir(folder):
        return None
    hits = sorted(f for f in os.listdir(folder) if f.startswith(prefix) and f.endswith(".whl"))
    return os.path.join(folder, hits[0]) if hits else None


def fetch_wheels(platform, python_version, versions, log=print):
    """Paths of the numpy and pyerfa wheels for that platform and Python, downloading
    only those not yet in build/wheels/<platform>-py<version>/."""
    folder = os.path.join(WHEEL_CACHE, f"{platform}-py{python_version}")
    wanted = {dist: versions[dist] for dist in BUNDLED}
    missing = [d for d, v in wanted.items() if not _cached(folder, d, v)]
    if missing:
        os.makedirs(folder, exist_ok=True)
        cmd = [sys.executable, "-m", "pip", "download", "--quiet", "--only-binary=:all:",
               "--no-deps", "--python-version", python_version, "--dest", folder]
        for tag in pip_platforms(platform):
            cmd += ["--platform", tag]
        cmd += [f"{d}=={wanted[d]}" for d in missing]
        log(f"bundle: downloading {', '.join(cmd[-len(missing):])} for {platform}, "
            f"Python {python_version}")
        done = subprocess.run(cmd, capture_output=True, text=True)
        if done.returncode != 0:
            raise SystemExit(
                f"pip download found no wheel for {platform}, Python {python_version}:\n"
                f"{done.stdout}{done.stderr}"
            )
    wheels = {d: _cached(folder, d, v) for d, v in wanted.items()}
    lost = [d for d, w in wheels.items() if w is None]
    if lost:
        raise SystemExit(f"pip download left no wheel of {', '.join(lost)} in {folder}")
    return wheels


def _skip(name):
    """Parts of a wheel the add-in never runs: the packages' own test suites, and the
    command-line scripts and C headers of a wheel's .data folder."""
    parts = name.split("/")
    if "tests" in parts[1:-1]:
        return True
    return parts[0].endswith(".data") and len(parts) > 1 and parts[1] not in ("purelib", "platlib")


def unpack_wheels(wheels, pythonpath):
    """Unpack each wheel into ``pythonpath`` as an installer would (a wheel is a zip of
    the site-packages tree; purelib/platlib of its .data folder go to the top).  The
    .dist-info folders stay: they hold the packages' licences."""
    for wheel in wheels:
        with zipfile.ZipFile(wheel) as z:
            for info in z.infolist():
                name = info.filename
                if info.is_dir() or _skip(name):
                    continue
                parts = name.split("/")
                if parts[0].endswith(".data"):
                    parts = parts[2:]
                target = os.path.join(pythonpath, *parts)
                os.makedirs(os.path.dirname(target), exist_ok=True)
                with z.open(info) as src, open(target, "wb") as dst:
                    shutil.copyfileobj(src, dst)


def compiled_modules(folder):
    """Every compiled module and shared library under ``folder``."""
    out = []
    for dirpath, _dirs, files in os.walk(folder):
        for f in files:
            if f.endswith((".so", ".dylib", ".pyd", ".dll")) or ".so." in f:
                out.append(os.path.join(dirpath, f))
    return sorted(out)


def codesign(folder, identity, tool="codesign"):
    """Sign every .so/.dylib for macOS (``-`` is an ad-hoc identity, or a "Developer ID
    Application: ..." name from the keychain); macOS refuses to load unsigned compiled
    code into the office.  Needs Apple's codesign, i.e. a Mac."""
    if shutil.which(tool) is None:
        raise SystemExit("--codesign needs Apple's codesign tool (build on a Mac)")
    signed = [p for p in compiled_modules(folder) if p.endswith((".so", ".dylib"))]
    for path in signed:
        subprocess.run([tool, "--force", "--sign", identity, path], check=True)
    return signed


def stage(platform, python_version, versions, pythonpath, codesign_identity=None, log=print):
    """Fetch, unpack (and for macOS sign) numpy and pyerfa into ``pythonpath``; returns a
    one-line account of what went in."""
    wheels = fetch_wheels(platform, python_version, versions, log=log)
    unpack_wheels(wheels.values(), pythonpath)
    if codesign_identity:
        signed = codesign(pythonpath, codesign_identity)
        log(f"bundle: signed {len(signed)} compiled modules as {codesign_identity!r}")
    return ", ".join(os.path.basename(w) for w in wheels.values())
