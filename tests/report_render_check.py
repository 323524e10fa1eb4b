#!/usr/bin/env python3
"""report_render_check.py: checks of a report rendered by headless Chromium (standard library only).

  html FILE               the page references nothing outside itself
  png FILE W H            a screenshot has the expected size and shows a rendered page
  netlog FILE             no request made by the page (requests of the browser itself are told
                          apart by their network isolation key and initiator)
  netlog-expect FILE      the opposite: the page did request something (the positive control
                          that shows the netlog check can see a request)

Exit status 0 when the check holds, 1 with a message when not.
"""
import json
import re
import struct
import sys
import zlib


def fail(msg):
    print("FAIL: " + msg)
    sys.exit(1)


def check_html(path):
    text = open(path, encoding="utf-8").read()
    # Anything that makes a browser fetch: scripts, style sheets, images, fonts, frames, imports.
    patterns = {
        "a URL with a scheme that fetches (http, https, ftp, //host)": r"(?i)(https?|ftp):|[\"'(]//[a-z0-9]",
        "a src attribute": r"(?i)\ssrc\s*=",
        "a script element": r"(?i)<script",
        "a link element": r"(?i)<link",
        "an iframe, object or embed": r"(?i)<(iframe|object|embed)\b",
        "a CSS import": r"(?i)@import",
        "a CSS url() that is not a fragment": r"(?i)url\(\s*['\"]?(?!#)",
        "an image or use element with an href": r"(?i)<(image|use)\b[^>]*href",
        "a font face": r"(?i)@font-face",
    }
    for what, pat in patterns.items():
        m = re.search(pat, text)
        if m:
            a = max(0, m.start() - 60)
            fail("%s has %s: ...%s..." % (path, what, text[a:m.end() + 60].replace("\n", " ")))
    print("ok: %s references nothing outside itself (%d bytes)" % (path, len(text)))


def read_png(path):
    """Decode an 8-bit, non-interlaced PNG (greyscale, RGB or RGBA) per the PNG specification
    (ISO/IEC 15948, W3C PNG 2nd edition): chunks, zlib stream, the five filter types."""
    data = open(path, "rb").read()
    if data[:8] != b"\x89PNG\r\n\x1a\n":
        fail("%s is not a PNG file" % path)
    pos, idat, ihdr = 8, b"", None
    while pos < len(data):
        n, kind = struct.unpack(">I4s", data[pos:pos + 8])
        body = data[pos + 8:pos + 8 + n]
        if kind == b"IHDR":
            ihdr = struct.unpack(">IIBBBBB", body)
        elif kind == b"IDAT":
            idat += body
        pos += 12 + n
    w, h, depth, ctype, _, _, interlace = ihdr
    if depth != 8 or interlace != 0 or ctype not in (0, 2, 6):
        fail("%s: unsupported PNG (depth %d, colour type %d, interlace %d)" % (path, depth, ctype, interlace))
    bpp = {0: 1, 2: 3, 6: 4}[ctype]
    raw = zlib.decompress(idat)
    stride = w * bpp
    rows, prev, i = [], bytearray(stride), 0
    for _ in range(h):
        f = raw[i]
        line = bytearray(raw[i + 1:i + 1 + stride])
        i += 1 + stride
        for x in range(stride):
            a = line[x - bpp] if x >= bpp else 0
            b = prev[x]
            c = prev[x - bpp] if x >= bpp else 0
            if f == 1:
                line[x] = (line[x] + a) & 255
            elif f == 2:
                line[x] = (line[x] + b) & 255
            elif f == 3:
                line[x] = (line[x] + (a + b) // 2) & 255
            elif f == 4:
                p = a + b - c
                pa, pb, pc = abs(p - a), abs(p - b), abs(p - c)
                line[x] = (line[x] + (a if pa <= pb and pa <= pc else b if pb <= pc else c)) & 255
        rows.append(line)
        prev = line
    return w, h, bpp, rows


def check_png(path, want_w, want_h):
    w, h, bpp, rows = read_png(path)
    if (w, h) != (want_w, want_h):
        fail("%s is %dx%d, expected %dx%d" % (path, w, h, want_w, want_h))
    n = nonwhite = dark = 0
    colours = set()
    top_dark = 0
    for y, line in enumerate(rows):
        for x in range(0, w * bpp, bpp * 2):  # every other pixel is plenty
            r, g, b = (line[x], line[x], line[x]) if bpp == 1 else (line[x], line[x + 1], line[x + 2])
            luma = 0.299 * r + 0.587 * g + 0.114 * b  # ITU-R BT.601 weights
            n += 1
            if luma < 245:
                nonwhite += 1
            if luma < 110:
                dark += 1
                if y < h // 5:
                    top_dark += 1
            if len(colours) < 5000:
                colours.add((r >> 3, g >> 3, b >> 3))
    f_nonwhite, f_dark = nonwhite / n, dark / n
    if f_nonwhite < 0.04:
        fail("%s is nearly blank (%.1f %% non-white)" % (path, 100 * f_nonwhite))
    if f_nonwhite > 0.8:
        fail("%s is nearly filled (%.1f %% non-white): not a page of text and plots" % (path, 100 * f_nonwhite))
    if f_dark < 0.005 or top_dark == 0:
        fail("%s shows no dark text (%.2f %% dark pixels, %d in the top fifth)" % (path, 100 * f_dark, top_dark))
    if len(colours) < 20:
        fail("%s has only %d colours: plots and text were not drawn" % (path, len(colours)))
    print("ok: %s %dx%d, %.1f %% non-white, %.2f %% dark, %d colours" % (path, w, h, 100 * f_nonwhite, 100 * f_dark,
                                                                       len(colours)))


def page_requests(path):
    text = open(path, encoding="utf-8", errors="replace").read()
    try:
        log = json.loads(text)
    except json.JSONDecodeError:  # a log cut short when the browser exits: close it
        log = json.loads(text.rstrip().rstrip(",") + "]}")
    names = {v: k for k, v in log["constants"]["logEventTypes"].items()}
    found = []
    for e in log.get("events", []):
        if names.get(e.get("type")) != "URL_REQUEST_START_JOB":
            continue
        p = e.get("params", {})
        url = p.get("url", "")
        nik = p.get("network_isolation_key", "")
        init = p.get("initiator", "")
        # The browser's own requests (update checks and the like) carry no initiating origin and
        # no isolation key of the page; a request made by the page carries the page's (file://).
        if "file://" in nik or (init not in ("", "not an origin")):
            found.append(url)
    return found


def check_netlog(path, expect_requests):
    found = page_requests(path)
    if expect_requests and not found:
        fail("%s: the control page's requests were not seen: the netlog check cannot see requests" % path)
    if not expect_requests and found:
        fail("%s: the page made network requests: %s" % (path, ", ".join(found[:5])))
    print("ok: %s: %d request(s) made by the page%s" % (path, len(found), " (control)" if expect_requests else ""))


def main(argv):
    if len(argv) < 3:
        fail(__doc__)
    what = argv[1]
    if what == "html":
        check_html(argv[2])
    elif what == "png":
        check_png(argv[2], int(argv[3]), int(argv[4]))
    elif what == "netlog":
        check_netlog(argv[2], False)
    elif what == "netlog-expect":
        check_netlog(argv[2], True)
    else:
        fail("unknown check " + what)


if __name__ == "__main__":
    main(sys.argv)
