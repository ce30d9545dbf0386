"""A screenshot of the real Calc window: a sample sheet with the Function Wizard open.

    .venv/bin/python tools/screenshot.py --oxt dist/eclipsheet.oxt [--out PATH.png]
    .venv/bin/python tools/screenshot.py --oxt dist/eclipsheet.oxt --charts

The second form takes the README's other picture, docs/images/sky-charts.png: the
charts of sample_sheets/sky_charts.ods on the Sun's sheet, without the wizard.

Starts a virtual screen (Xvfb), the ordinary windowed office on it with a fresh
profile and the built extension, opens a sample sheet, selects a cell that holds one of
our formulas, opens the Function Wizard on it (the dispatch command behind Insert >
Function) and saves the screen as a PNG, docs/images/first-hour.png by default.  Run it
again after changing the wizard texts or the sample sheets to refresh the README's
picture.  The sample is opened from a temporary copy: the original is never touched.

Xvfb writes its screen to a file (``-fbdir``, in the X Window Dump format), so reading
the picture needs no screen-grabbing program; the PNG is written here with zlib.
"""

import argparse
import collections
import os
import shutil
import struct
import subprocess
import sys
import tempfile
import time
import zlib

import numpy as np

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
sys.path.insert(0, HERE)

SIZE = (1280, 800)
SAMPLE = os.path.join(ROOT, "sample_sheets", "observing_log.ods")
SHEET = "Observing log"
CELL = "E3"  # =SKY.JD(B3;"UTC";"TT"), the README's first formula
ZOOM = 90  # per cent
OUT = os.path.join(ROOT, "docs", "images", "first-hour.png")
CHARTS = dict(out=os.path.join(ROOT, "docs", "images", "sky-charts.png"),
              sample=os.path.join(ROOT, "sample_sheets", "sky_charts.ods"),
              sheet_name="Sun's year", cell="B6", wizard=False, zoom=72)


class VirtualScreen:
    """An Xvfb display of its own (a free display number), ended on exit."""

    def __init__(self, width, height):
        self.width, self.height = width, height
        self.process = None
        self.display = None
        self._fbdir = None

    def __enter__(self):
        xvfb = shutil.which("Xvfb")
        if xvfb is None:
            raise RuntimeError("Xvfb is not installed (Debian package xvfb; tools/setup.sh "
                               "installs it)")
        self._fbdir = tempfile.mkdtemp(prefix="eclipsheet-screen-")
        read_end, write_end = os.pipe()
        try:
            # -displayfd: Xvfb picks a free display and writes its number to the pipe;
            # -fbdir: it keeps the screen in a file there; -nocursor: no mouse pointer.
            self.process = subprocess.Popen(
                [xvfb, "-displayfd", str(write_end), "-screen", "0",
                 f"{self.width}x{self.height}x24", "-fbdir", self._fbdir,
                 "-nolisten", "tcp", "-nocursor"],
                pass_fds=(write_end,), stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL,
            )
            os.close(write_end)
            write_end = None
            number = b""
            while not number.endswith(b"\n"):
                chunk = os.read(read_end, 16)
                if not chunk:
                    raise RuntimeError("Xvfb did not start")
                number += chunk
        except BaseException:
            self.__exit__()
            raise
        finally:
            os.close(read_end)
            if write_end is not None:
                os.close(write_end)
        self.display = ":" + number.decode().strip()
        return self

    def __exit__(self, *exc):
        if self.process is not None:
            self.process.terminate()
            try:
                self.process.wait(timeout=20)
            except subprocess.TimeoutExpired:
                self.process.kill()
                self.process.wait()
        shutil.rmtree(self._fbdir, ignore_errors=True)

    def grab(self):
        """The screen now, as an array of shape (height, width, 3) of uint8 RGB."""
        with open(os.path.join(self._fbdir, "Xvfb_screen0"), "rb") as f:
            return read_xwd(f.read())

    def wait_until_still(self, timeout=30.0, interval=0.5, settle=3):
        """Wait until the screen has not changed for ``settle`` looks in a row: the
        office has finished painting.  Returns the last picture."""
        deadline = time.time() + timeout
        last, same = self.grab(), 0
        while time.time() < deadline:
            time.sleep(interval)
            now = self.grab()
            same = same + 1 if np.array_equal(now, last) else 0
            if same >= settle:
                return now
            last = now
        return last


def read_xwd(data):
    """Decode an X Window Dump of a 24-bit TrueColor screen (as Xvfb -fbdir writes it)."""
    names = ("header_size", "version", "format", "depth", "width", "height", "xoffset",
             "byte_order", "unit", "bit_order", "pad", "bits_per_pixel", "bytes_per_line",
             "visual_class", "red_mask", "green_mask", "blue_mask", "bits_per_rgb",
             "colormap_entries", "ncolors")
    h = dict(zip(names, struct.unpack(">20I", data[:80])))
    if h["version"] != 7 or h["bits_per_pixel"] != 32 or h["depth"] != 24:
        raise ValueError(f"not a 24-bit XWD screen dump: {h}")
    offset = h["header_size"] + 12 * h["ncolors"]  # the colour map follows the header
    rows = np.frombuffer(data, np.uint8, h["height"] * h["bytes_per_line"], offset)
    pixels = rows.reshape(h["height"], h["bytes_per_line"])[:, :4 * h["width"]]
    words = pixels.reshape(h["height"], h["width"], 4).copy().view(
        "<u4" if h["byte_order"] == 0 else ">u4")[:, :, 0]
    out = np.empty((h["height"], h["width"], 3), np.uint8)
    for k, mask in enumerate((h["red_mask"], h["green_mask"], h["blue_mask"])):
        shift = (mask & -mask).bit_length() - 1
        out[:, :, k] = (words & mask) >> shift
    return out


def _paeth(a, b, c):
    p = a + b - c
    pa, pb, pc = np.abs(p - a), np.abs(p - b), np.abs(p - c)
    return np.where((pa <= pb) & (pa <= pc), a, np.where(pb <= pc, b, c))


def palette_of(rgb, size=256, frequent=64):
    """At most ``size`` colours for an indexed PNG, and each pixel's index.

    A screen has a few colours over most of its area and a long tail of anti-aliasing
    shades.  The ``frequent`` commonest colours are kept exactly; the rest of the
    palette is chosen one colour at a time, each the colour worst served so far (its
    distance to the nearest chosen colour, weighted by the square root of how many
    pixels have it), so that small icons keep their hues.  Every other colour maps to
    its nearest palette entry; a picture with few enough colours is kept exactly.
    Returns (palette, index per pixel, whether the palette is exact)."""
    colours, index, counts = np.unique(rgb.reshape(-1, 3), axis=0, return_inverse=True,
                                       return_counts=True)
    index = index.ravel()
    if len(colours) <= size:
        return colours.astype(np.uint8), index, True
    c = colours.astype(np.int64)
    chosen = list(np.argsort(counts)[::-1][:frequent])
    gap = ((c[:, None, :] - c[chosen][None, :, :]) ** 2).sum(-1).min(1)
    weight = np.sqrt(counts)
    while len(chosen) < size:
        k = int(np.argmax(gap * weight))
        chosen.append(k)
        gap = np.minimum(gap, ((c - c[k]) ** 2).sum(-1))
    palette = c[chosen]
    nearest = ((c[:, None, :] - palette[None, :, :]) ** 2).sum(-1).argmin(1)
    return palette.astype(np.uint8), nearest[index], False


def png_bytes(rgb, lossless=False):
    """A PNG of an RGB array: indexed (see palette_of), or RGB when ``lossless`` and the
    picture has more than 256 colours.  Each row takes the PNG filter that leaves the
    smallest sum of absolute differences (the usual heuristic of PNG encoders)."""
    height, width, _ = rgb.shape
    palette, index, exact = palette_of(rgb)
    if lossless and not exact:
        image = rgb.astype(np.int16)
        header = struct.pack(">IIBBBBB", width, height, 8, 2, 0, 0, 0)
        extra = []
    else:
        image = index.reshape(height, width, 1).astype(np.int16)
        header = struct.pack(">IIBBBBB", width, height, 8, 3, 0, 0, 0)
        extra = [(b"PLTE", palette.tobytes())]
    bpp = image.shape[2]
    flat_rows = image.reshape(height, width * bpp)
    zero = np.zeros(width * bpp, np.int16)
    raw = bytearray()
    for y in range(height):
        x = flat_rows[y]
        up = flat_rows[y - 1] if y else zero
        left = np.concatenate([np.zeros(bpp, np.int16), x[:-bpp]])
        upleft = np.concatenate([np.zeros(bpp, np.int16), up[:-bpp]])
        candidates = [x, x - left, x - up, x - (left + up) // 2, x - _paeth(left, up, upleft)]
        costs = [np.abs(((c + 128) % 256) - 128).sum() for c in candidates]
        best = int(np.argmin(costs))
        raw.append(best)
        raw += (candidates[best] % 256).astype(np.uint8).tobytes()

    def chunk(kind, body):  # length, type, data, CRC-32 of type and data
        crc = struct.pack(">I", zlib.crc32(kind + body))
        return struct.pack(">I", len(body)) + kind + body + crc

    return b"".join([b"\x89PNG\r\n\x1a\n", chunk(b"IHDR", header)]
                    + [chunk(k, b) for k, b in extra]
                    + [chunk(b"IDAT", zlib.compress(bytes(raw), 9)), chunk(b"IEND", b"")])


def write_png(path, rgb, lossless=False):
    """Write beside the target, then move into place."""
    from officekit import written_beside

    path = os.path.abspath(path)
    os.makedirs(os.path.dirname(path), exist_ok=True)
    with written_beside(path) as partial, open(partial, "wb") as f:
        f.write(png_bytes(rgb, lossless))
    return path


def visible_office(oxt, screen):
    """The ordinary windowed office on ``screen``, with its own fresh profile.  The
    plain X11 look (VCL plug-in "gen", part of the office itself) is asked for, so the
    picture does not depend on which desktop toolkits the machine has."""
    import officekit

    return officekit.Office(oxt=oxt, visible=True,
                            env={"DISPLAY": screen.display, "SAL_USE_VCLPLUGIN": "gen"})


def open_in_window(office, screen, path, sheet_name, scratch, zoom=ZOOM):
    """Open a copy of ``path`` (made in the folder ``scratch``, so the original is never
    locked or written) in a window filling the screen, on the sheet ``sheet_name``."""
    doc = office.open_copy(path, scratch)
    window = doc.CurrentController.Frame.ContainerWindow
    window.setPosSize(0, 0, screen.width, screen.height, 15)  # PosSize.POSSIZE
    controller = doc.CurrentController
    controller.setActiveSheet(doc.Sheets.getByName(sheet_name))
    # 90 %: the first five columns of the log fit to the left of the wizard.
    controller.ZoomType = 3  # com.sun.star.view.DocumentZoomType.BY_VALUE
    controller.ZoomValue = zoom
    return doc


def open_function_wizard(office, doc, cell_name, timeout=20.0):
    """Select a cell and open the Function Wizard on its formula, as Insert > Function
    does; returns the wizard's window, or None if no new window appeared."""
    controller = doc.CurrentController
    controller.select(controller.ActiveSheet.getCellRangeByName(cell_name))
    controller.setFirstVisibleColumn(0)
    controller.setFirstVisibleRow(0)
    toolkit = office.service("com.sun.star.awt.Toolkit")
    shown_before = {_title(w) for w in _shown_top_windows(toolkit)}
    helper = office.service("com.sun.star.frame.DispatchHelper")
    helper.executeDispatch(controller.Frame, ".uno:FunctionDialog", "", 0, ())
    deadline = time.time() + timeout
    while time.time() < deadline:
        for window in _shown_top_windows(toolkit):
            if _title(window) not in shown_before:
                return window
        time.sleep(0.25)
    return None


def _shown_top_windows(toolkit):
    windows = (toolkit.getTopWindow(i) for i in range(toolkit.getTopWindowCount()))
    return [w for w in windows if w.isVisible() and w.getPosSize().Width > 0]


def _title(window):
    try:
        return window.getAccessibleContext().getAccessibleName()
    except Exception:  # a window without an accessible name
        return ""


Shot = collections.namedtuple("Shot", "path formula value wizard_title picture")


def take(oxt, out=OUT, sample=SAMPLE, sheet_name=SHEET, cell=CELL, size=SIZE,
         lossless=False, wizard=True, zoom=ZOOM):
    """Take the screenshot and write it to ``out``; returns a Shot.  ``wizard=False``:
    the sheet alone, with ``cell`` selected (for a sheet whose charts are the point)."""
    with VirtualScreen(*size) as screen, visible_office(oxt, screen) as office, \
            tempfile.TemporaryDirectory() as scratch:
        doc = open_in_window(office, screen, sample, sheet_name, scratch, zoom)
        try:
            target = doc.CurrentController.ActiveSheet.getCellRangeByName(cell)
            formula, value = target.getFormula(), target.getValue()
            if not wizard:
                controller = doc.CurrentController
                controller.select(target)
                controller.setFirstVisibleColumn(0)
                controller.setFirstVisibleRow(0)
                picture = screen.wait_until_still()
                return Shot(write_png(out, picture, lossless), formula, value, "", picture)
            wizard = open_function_wizard(office, doc, cell)
            if wizard is None:
                raise RuntimeError("the Function Wizard did not open")
            # Beside the sheet's first columns rather than over them.
            box = wizard.getPosSize()
            wizard.setPosSize(screen.width - box.Width - 40, 150, 0, 0, 3)  # PosSize.POS
            picture = screen.wait_until_still()
            path = write_png(out, picture, lossless)
            return Shot(path, formula, value, _title(wizard), picture)
        finally:
            doc.close(True)


def main(argv=None):
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--oxt", required=True)
    ap.add_argument("--out", default=OUT)
    ap.add_argument("--sheet-file", default=SAMPLE)
    ap.add_argument("--sheet", default=SHEET)
    ap.add_argument("--cell", default=CELL)
    ap.add_argument("--charts", action="store_true",
                    help="the charts of sample_sheets/sky_charts.ods instead (no wizard), "
                    "to docs/images/sky-charts.png unless --out says otherwise")
    ap.add_argument("--lossless", action="store_true",
                    help="keep every colour (a larger file) instead of a 256-colour palette")
    args = ap.parse_args(argv)
    if args.charts:
        chosen = dict(CHARTS)
        if args.out != OUT:
            chosen["out"] = args.out
        shot = take(args.oxt, lossless=args.lossless, **chosen)
        args.sheet, args.cell = chosen["sheet_name"], chosen["cell"]
    else:
        shot = take(args.oxt, args.out, args.sheet_file, args.sheet, args.cell,
                    lossless=args.lossless)
    print(f"{shot.path}: {args.sheet}.{args.cell} {shot.formula} = {shot.value}; "
          f"{shot.wizard_title!r} open; {os.path.getsize(shot.path)} bytes")
    return 0


if __name__ == "__main__":
    sys.exit(main())
