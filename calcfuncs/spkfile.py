"""Opening a JPL SPK kernel so that no file can hang or crash the office.

A kernel is a NAIF Double precision Array File (DAF, an open format described in NAIF's
"DAF Required Reading"): 1024-byte records; record 1 says the format word, the number
layout (ND doubles and NI integers per segment summary), the byte order and the first
summary record; summary records form a chain, each holding up to 25 segment summaries
(for an SPK, ND = 2, NI = 6) and pointing to the next; each summary gives the word
addresses of its segment's data.

jplephem (which evaluates the segments) trusts all of that: a chain that points back to
itself loops for ever, and an address past the end is found only when it is read.  So
the file's structure is checked here first, with bounds, and only a file that passes is
handed over, through the same open file:

- only a regular file is opened (never a FIFO, a device, a socket or a directory, and
  that holds for a link to one), without blocking, and it must be the file that was
  checked (same device and inode);
- every summary record is visited at most once and lies inside the file; the number of
  summary records and of segments is bounded;
- every segment's data lies inside the file and after the file record; Chebyshev
  segments (types 2 and 3) have a directory whose counts fill the segment exactly;
- the format word, the byte order and the FTP check string are checked.

Every failure is a ``SkyError`` naming the problem.  The work is a few reads per
summary record, so a bad file is answered at once.
"""

import math
import os
import stat
import struct

from .errors import SkyError

RECORD_BYTES = 1024
WORD_BYTES = 8
SPK_ND, SPK_NI = 2, 6  # an SPK summary: start and end (TDB seconds), then 6 integers
SUMMARY_WORDS = SPK_ND + (SPK_NI + 1) // 2  # 5 words of 8 bytes
SUMMARIES_PER_RECORD = (RECORD_BYTES // WORD_BYTES - 3) // SUMMARY_WORDS  # 25
# More summary records than the planetary kernels have (DE440 and each part of DE441
# have one): a bound on the work a file can ask for (50,000 segments, each a few reads).
MAX_SUMMARY_RECORDS = 2_000
BYTE_ORDERS = {b"LTL-IEEE": "<", b"BIG-IEEE": ">"}
# NAIF's FTP check string (DAF Required Reading): a file sent through a text-mode
# transfer has it altered, and so has every number after it.
FTP_CHECK = b"FTPSTR:\r:\n:\r\n:\r\x00:\x81:\x10\xce:ENDFTP"
_KINDS = ((stat.S_ISDIR, "a folder"), (stat.S_ISFIFO, "a named pipe (FIFO)"),
          (stat.S_ISCHR, "a character device"), (stat.S_ISBLK, "a block device"),
          (stat.S_ISSOCK, "a socket"))


def file_kind(mode):
    for test, kind in _KINDS:
        if test(mode):
            return kind
    return "not a regular file"


def stamp(path):
    """What identifies the file's present content in a cache: the file's path, device,
    inode, size and modification time (a kernel replaced on disk changes one of them)."""
    try:
        st = os.stat(path)
    except FileNotFoundError:
        raise SkyError(f'no kernel file "{path}"') from None
    except OSError as err:
        raise SkyError(f'cannot open the kernel "{path}" ({err.strerror})') from None
    if not stat.S_ISREG(st.st_mode):
        raise SkyError(f'"{os.path.basename(path)}" is {file_kind(st.st_mode)}, not a '
                       "kernel file; give a .bsp file")
    return (path, st.st_dev, st.st_ino, st.st_size, st.st_mtime_ns)


def open_checked(path):
    """(the open file, its stamp): the kernel opened for reading (binary), its structure
    checked.  The caller owns the file."""
    key = stamp(path)
    label = os.path.basename(path)
    flags = os.O_RDONLY | getattr(os, "O_NONBLOCK", 0) | getattr(os, "O_BINARY", 0)
    try:
        fd = os.open(path, flags)
    except OSError as err:
        raise SkyError(f'cannot open the kernel "{path}" ({err.strerror})') from None
    try:
        st = os.fstat(fd)
        if not stat.S_ISREG(st.st_mode) or (st.st_dev, st.st_ino) != key[1:3]:
            raise SkyError(f'"{label}" changed while it was being opened; try again')
        check_structure(lambda offset, n: os.pread(fd, n, offset), st.st_size, label)
        return os.fdopen(fd, "rb"), (path, st.st_dev, st.st_ino, st.st_size, st.st_mtime_ns)
    except BaseException:
        os.close(fd)
        raise


def _finite_integer(value):
    return math.isfinite(value) and value == int(value)


def check_structure(read, size, label):
    """Check a DAF/SPK file's structure; ``read(offset, n)`` returns its bytes.  Returns
    the number of segments."""
    if size == 0:
        raise SkyError(f'"{label}" is empty, not a kernel')
    if size < RECORD_BYTES:
        raise SkyError(f'"{label}" is truncated or not a kernel: {size} bytes, less than '
                       "its first record")
    head = read(0, RECORD_BYTES)
    word = head[:8]
    if word.startswith(b"DAF/") and word != b"DAF/SPK ":
        raise SkyError(f'"{label}" is a {_printable(word)} file, not an SPK kernel')
    if word not in (b"DAF/SPK ", b"NAIF/DAF"):
        raise SkyError(f'"{label}" is not a JPL SPK kernel: it starts with '
                       f'"{_printable(word)}", not the format word "DAF/SPK"')
    declared = head[88:96]
    if word == b"NAIF/DAF":  # the older layout, without the byte-order word
        order = next((o for o in "<>" if struct.unpack(o + "ii", head[8:16]) ==
                      (SPK_ND, SPK_NI)), None)
        if order is None:
            raise SkyError(f'"{label}": neither byte order gives an SPK summary layout')
    else:
        order = BYTE_ORDERS.get(declared)
        if order is None:
            raise SkyError(f'"{label}": unknown number format "{_printable(declared)}" '
                           "(LTL-IEEE or BIG-IEEE expected)")
        if head[500:1000].strip(b"\0") != FTP_CHECK:
            raise SkyError(f'"{label}" was damaged in transfer (its FTP check string is '
                           "altered: copy it in binary mode)")
    nd, ni = struct.unpack(order + "ii", head[8:16])
    if (nd, ni) != (SPK_ND, SPK_NI):
        other = "<" if order == ">" else ">"
        if struct.unpack(other + "ii", head[8:16]) == (SPK_ND, SPK_NI):
            raise SkyError(f'"{label}": its numbers are in the other byte order than its '
                           f'format word "{_printable(declared)}" says')
        raise SkyError(f'"{label}": summary layout ND={nd}, NI={ni}, not an SPK kernel\'s '
                       f"({SPK_ND}, {SPK_NI})")
    fward, _bward, free = struct.unpack(order + "iii", head[76:88])
    words = size // WORD_BYTES
    if free < 2 or free - 1 > words:
        raise SkyError(f'"{label}" is truncated: it says it holds {max(free - 1, 0)} words '
                       f"of data but has {words} ({size} bytes)")
    whole_records = size // RECORD_BYTES
    double3 = struct.Struct(order + "ddd")
    summary = struct.Struct(order + "dd6i")
    seen = set()
    record = fward
    count = 0
    while record != 0:
        if record in seen:
            raise SkyError(f'"{label}": its chain of summary records loops back to record '
                           f"{record}")
        if not 2 <= record < whole_records:  # the record and the names after it
            raise SkyError(f'"{label}": summary record {record} lies outside the file '
                           f"({whole_records} records)")
        if len(seen) >= MAX_SUMMARY_RECORDS:
            raise SkyError(f'"{label}": more than {MAX_SUMMARY_RECORDS} summary records')
        seen.add(record)
        data = read((record - 1) * RECORD_BYTES, RECORD_BYTES)
        nxt, _prev, nsum = double3.unpack_from(data)
        if not (_finite_integer(nsum) and 0 <= nsum <= SUMMARIES_PER_RECORD):
            raise SkyError(f'"{label}": summary record {record} says it holds {nsum:g} '
                           f"segments (at most {SUMMARIES_PER_RECORD} fit)")
        for k in range(int(nsum)):
            count += 1
            _check_segment(read, order, summary.unpack_from(data, 24 + 40 * k), free,
                           label, count)
        if not (_finite_integer(nxt) and 0 <= nxt < whole_records):
            raise SkyError(f'"{label}": summary record {record} points to record {nxt:g}, '
                           "outside the file")
        record = int(nxt)
    if count == 0:
        raise SkyError(f'"{label}" holds no segments')
    return count


def _check_segment(read, order, values, free, label, number):
    start_s, end_s, target, center, _frame, data_type, first, last = values
    where = f'"{label}", segment {number} ({center} -> {target})'
    if not (math.isfinite(start_s) and math.isfinite(end_s) and start_s <= end_s):
        raise SkyError(f"{where}: its span {start_s:g} to {end_s:g} s is not a span")
    if not RECORD_BYTES // WORD_BYTES < first <= last <= free - 1:
        raise SkyError(f"{where}: its data at words {first} to {last} lie outside the "
                       f"file's data (words {RECORD_BYTES // WORD_BYTES + 1} to {free - 1})")
    if data_type in (2, 3):  # Chebyshev: a directory of 4 words ends the segment
        if last - first + 1 < 4:
            raise SkyError(f"{where}: too short for its directory")
        init, intlen, rsize, n = struct.unpack(order + "4d",
                                               read((last - 4) * WORD_BYTES, 4 * WORD_BYTES))
        per_component = 3 if data_type == 2 else 6
        if not (math.isfinite(init) and math.isfinite(intlen) and intlen > 0
                and _finite_integer(rsize) and _finite_integer(n) and n >= 1
                and rsize >= 2 + per_component and (rsize - 2) % per_component == 0
                and n * rsize + 4 == last - first + 1):
            raise SkyError(f"{where}: its directory ({n:g} records of {rsize:g} words) "
                           f"does not fill its {last - first + 1} words")


def _printable(raw):
    """Bytes of a file shown in a message: printable ASCII kept, anything else as "?"."""
    return "".join(chr(b) if 32 <= b < 127 else "?" for b in raw).strip()
