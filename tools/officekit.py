"""Drive a real headless LibreOffice: a fresh profile, the extension installed, UNO calls.

Used by the office tests, the tools (recompute, freeze, the sheet makers, the screenshot)
and the benchmark.  Runs in
a Python that can ``import uno`` (Debian's python3, or a venv made from it with
``--system-site-packages``).

    with Office(oxt="dist/eclipsheet.oxt") as office:
        doc = office.new_sheet()
        ...
"""

import contextlib
import os
import pwd
import shutil
import socket
import subprocess
import tempfile
import time

import uno
from com.sun.star.beans import PropertyValue

# Which office: the system's, or the one whose program folder ECLIPSHEET_OFFICE names
# (the tests run on both: LibreOffice 25.2 unpacked by tools/office25.sh beside 7.4).
OFFICE_PROGRAM = os.environ.get("ECLIPSHEET_OFFICE")
if OFFICE_PROGRAM:
    # The real folder (tools/office25.sh links .office25 to a store every user can
    # enter): unopkg runs as 'nobody' when root, and must not pass through a private
    # checkout folder.
    OFFICE_PROGRAM = os.path.realpath(OFFICE_PROGRAM)
    SOFFICE = os.path.join(OFFICE_PROGRAM, "soffice")
    UNOPKG = os.path.join(OFFICE_PROGRAM, "unopkg")
    # Debian's uno.py points URE_BOOTSTRAP at the system office's fundamentalrc in this
    # process's environment; inherited, it would make the other office read the system
    # office's settings, libraries and types.
    OFFICE_ENV = {"URE_BOOTSTRAP": "vnd.sun.star.pathname:"
                  + os.path.join(OFFICE_PROGRAM, "fundamentalrc")}
else:
    OFFICE_ENV = {}
    SOFFICE = shutil.which("soffice") or "/usr/lib/libreoffice/program/soffice"
    UNOPKG = shutil.which("unopkg") or "/usr/lib/libreoffice/program/unopkg"


def _props(**kw):
    out = []
    for k, v in kw.items():
        p = PropertyValue()
        p.Name = k
        p.Value = v
        out.append(p)
    return tuple(out)


def file_url(path):
    return uno.systemPathToFileUrl(os.path.abspath(path))


@contextlib.contextmanager
def written_beside(path):
    """Yield a path beside ``path`` to write the file to; when the block ends without an
    error it is moved into place, so that no reader ever sees it half-written."""
    path = os.path.abspath(path)
    partial = os.path.join(os.path.dirname(path), ".partial-" + os.path.basename(path))
    yield partial
    os.replace(partial, path)


def _free_port():
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


def _as_unprivileged(cmd, profile):
    """unopkg refuses a per-user install as root, so as root run it as 'nobody'."""
    if os.geteuid() != 0:
        return cmd, None
    nobody = pwd.getpwnam("nobody")
    for dirpath, _dirs, files in os.walk(profile):
        os.chown(dirpath, nobody.pw_uid, nobody.pw_gid)
        for f in files:
            os.chown(os.path.join(dirpath, f), nobody.pw_uid, nobody.pw_gid)
    return (
        ["setpriv", f"--reuid={nobody.pw_uid}", f"--regid={nobody.pw_gid}", "--clear-groups",
         "env", f"HOME={profile}"] + cmd,
        nobody,
    )


def unopkg(profile, *args):
    """Run ``unopkg`` on the user profile ``profile`` (as 'nobody' when root) and return
    the finished process; raises with its output if it fails."""
    os.makedirs(profile, exist_ok=True)
    cmd = [UNOPKG, *args, f"-env:UserInstallation={file_url(profile)}"]
    cmd, _ = _as_unprivileged(cmd, profile)
    cmd = ["env"] + [f"{k}={v}" for k, v in OFFICE_ENV.items()] + cmd
    # cwd: the unprivileged user may not enter the folder the tests run from.
    done = subprocess.run(cmd, capture_output=True, text=True, timeout=300, cwd=profile)
    if done.returncode != 0:
        raise RuntimeError(f"unopkg {args[0]} failed: {done.stdout}{done.stderr}")
    return done


def install_extension(oxt, profile):
    """Install ``oxt`` into the user profile ``profile`` with ``unopkg add``, replacing
    an installed version; the licence is accepted (-s) as a script cannot answer."""
    os.makedirs(profile, exist_ok=True)
    staged = os.path.join(profile, "staged-" + os.path.basename(oxt))
    shutil.copyfile(oxt, staged)
    return unopkg(profile, "add", "-f", "-s", staged)


class Office:
    """A headless office with its own fresh profile, ended on exit.  ``visible=True``
    starts the ordinary windowed office instead (on the display in ``env``, e.g. Xvfb)
    and opens documents in windows."""

    def __init__(self, oxt=None, profile=None, keep_profile=False, env=None, visible=False):
        self.oxt = oxt
        self.env = env
        self.visible = visible
        self._own_profile = profile is None
        self.profile = profile or tempfile.mkdtemp(prefix="eclipsheet-profile-")
        self.keep_profile = keep_profile or not self._own_profile
        self.process = None
        self.ctx = None
        self.desktop = None

    def __enter__(self):
        if self.oxt:
            install_extension(self.oxt, self.profile)
        self.start()
        return self

    def __exit__(self, *exc):
        self.stop()
        if not self.keep_profile:
            shutil.rmtree(self.profile, ignore_errors=True)

    def _first_start(self):
        """LibreOffice 25.2 restarts itself once on a fresh profile (exit code 81, seen
        here), which drops a bridge made to the first process: let it make the profile
        first, alone.  The system's 7.4 starts straight through."""
        if OFFICE_PROGRAM and not os.path.exists(
                os.path.join(self.profile, "user", "registrymodifications.xcu")):
            subprocess.run([SOFFICE, "--headless", "--invisible", "--norestore",
                            "--terminate_after_init",
                            f"-env:UserInstallation={file_url(self.profile)}"],
                           stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL,
                           env=dict(os.environ, **OFFICE_ENV, **(self.env or {})), timeout=120)

    def start(self, timeout=90):
        self._first_start()
        port = _free_port()
        self.process = subprocess.Popen(
            [SOFFICE] + ([] if self.visible else ["--headless", "--invisible"]) + [
                "--norestore", "--nologo", "--nodefault", "--nolockcheck",
                f"-env:UserInstallation={file_url(self.profile)}",
                f"--accept=socket,host=127.0.0.1,port={port};urp;StarOffice.ComponentContext",
            ],
            stdout=subprocess.DEVNULL,
            stderr=subprocess.DEVNULL,
            env=dict(os.environ, **OFFICE_ENV, **(self.env or {})),
        )
        local = uno.getComponentContext()
        resolver = local.ServiceManager.createInstanceWithContext(
            "com.sun.star.bridge.UnoUrlResolver", local
        )
        url = f"uno:socket,host=127.0.0.1,port={port};urp;StarOffice.ComponentContext"
        deadline = time.time() + timeout
        while True:
            try:
                self.ctx = resolver.resolve(url)
                break
            except Exception:
                if self.process.poll() is not None or time.time() > deadline:
                    raise RuntimeError("the office did not start")
                time.sleep(0.25)
        self.desktop = self.ctx.ServiceManager.createInstanceWithContext(
            "com.sun.star.frame.Desktop", self.ctx
        )
        return self

    def stop(self):
        if self.desktop is not None:
            try:
                self.desktop.terminate()
            except Exception:
                pass  # the bridge drops as the office quits
        if self.process is not None:
            try:
                self.process.wait(timeout=60)
            except subprocess.TimeoutExpired:
                self.process.kill()
                self.process.wait()
        self.desktop = self.ctx = self.process = None

    def service(self, name):
        return self.ctx.ServiceManager.createInstanceWithContext(name, self.ctx)

    def new_sheet(self):
        return self.desktop.loadComponentFromURL(
            "private:factory/scalc", "_blank", 0, _props(Hidden=not self.visible)
        )

    def open(self, path):
        doc = self.desktop.loadComponentFromURL(
            file_url(path), "_blank", 0, _props(Hidden=not self.visible)
        )
        if doc is None:
            raise RuntimeError(f"the office could not open {path}")
        return doc

    def open_copy(self, path, folder):
        """Open a copy of the document at ``path``, made in ``folder``: the office may
        touch a file it has open (lock files), so the original is never written."""
        copy = os.path.join(folder, os.path.basename(path))
        shutil.copyfile(path, copy)
        return self.open(copy)

    @contextlib.contextmanager
    def calculated_copy(self, path):
        """The document at ``path``, opened as a copy in a temporary folder with every
        formula computed again (a hard recalculation); closed and removed after the
        block.  The original is never written."""
        with tempfile.TemporaryDirectory() as tmp:
            doc = self.open_copy(path, tmp)
            try:
                doc.calculateAll()
                yield doc
            finally:
                doc.close(True)

    @staticmethod
    def save(doc, path, filter_name="calc8", **options):
        """Store a copy of ``doc`` at ``path`` (written beside, then moved into place)."""
        with written_beside(path) as partial:
            doc.storeToURL(file_url(partial),
                           _props(FilterName=filter_name, Overwrite=True, **options))
        return os.path.abspath(path)

    def install_with_extension_manager(self, oxt):
        """Install as the Extension Manager dialog does: the deployment API, user scope,
        confirming its question the way a user clicks OK.  Calc lists the new functions
        after the office restarts."""
        import unohelper
        from com.sun.star.task import XInteractionHandler
        from com.sun.star.ucb import XCommandEnvironment, XProgressHandler

        approve_type = uno.getTypeByName("com.sun.star.task.XInteractionApprove")

        class Confirm(unohelper.Base, XInteractionHandler):
            def handle(self, request):
                for choice in request.getContinuations():
                    if choice.queryInterface(approve_type):
                        choice.select()
                        return

        class Quiet(unohelper.Base, XProgressHandler):
            def push(self, status):
                pass

            def update(self, status):
                pass

            def pop(self):
                pass

        class Environment(unohelper.Base, XCommandEnvironment):
            def getInteractionHandler(self):
                return Confirm()

            def getProgressHandler(self):
                return Quiet()

        manager = self.ctx.getValueByName("/singletons/com.sun.star.deployment.ExtensionManager")
        staged = os.path.join(self.profile, "staged-" + os.path.basename(oxt))
        shutil.copyfile(oxt, staged)
        manager.addExtension(file_url(staged), (), "user", None, Environment())
        return [e.getIdentifier().Value for e in manager.getDeployedExtensions("user", None, Environment())]

    def function_descriptions(self):
        """The office's own view of every function: {display name: (description, args)}."""
        fd = self.service("com.sun.star.sheet.FunctionDescriptions")
        out = {}
        for i in range(fd.getCount()):
            props = {p.Name: p.Value for p in fd.getByIndex(i)}
            args = [(a.Name, a.Description) for a in props.get("Arguments") or ()]
            out[props["Name"]] = (props.get("Description", ""), args)
        return out


def formula_cells(sheet):
    """(column, row, formula, value) of every formula cell of a sheet, read a block at
    a time (one UNO call per block, not per cell)."""
    from com.sun.star.sheet.CellFlags import FORMULA

    ranges = sheet.queryContentCells(FORMULA)
    for k in range(ranges.getCount()):
        block = ranges.getByIndex(k)
        origin = block.getRangeAddress()
        for r, (frow, vrow) in enumerate(zip(block.getFormulaArray(), block.getDataArray())):
            for c, (f, v) in enumerate(zip(frow, vrow)):
                yield origin.StartColumn + c, origin.StartRow + r, f, v


def null_date(doc):
    d = doc.NullDate
    return (d.Year, d.Month, d.Day)


def set_null_date(doc, year, month, day):
    d = uno.createUnoStruct("com.sun.star.util.Date")
    d.Year, d.Month, d.Day = year, month, day
    doc.NullDate = d
