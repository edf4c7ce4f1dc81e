"""report_pngcheck.py — helpers of the report checks (imported, not a test):
a tiny PNG reader (zlib only) and the SVG axis inversion used to read data
values back from a figure."""
import re
import struct
import zlib

SVG = "{http://www.w3.org/2000/svg}"


def read_png(path):
    """Decode an 8-bit RGB or RGBA PNG into (width, height, rows of (r, g, b, a))."""
    data = open(path, "rb").read()
    if data[:8] != b"\x89PNG\r\n\x1a\n":
        raise ValueError(f"{path}: not a PNG file")
    pos, idat, width = 8, b"", None
    while pos < len(data):
        n, kind = struct.unpack(">I4s", data[pos:pos + 8])
        body = data[pos + 8:pos + 8 + n]
        pos += 12 + n
        if kind == b"IHDR":
            width, height, depth, ctype, _, _, interlace = struct.unpack(">IIBBBBB", body)
            if depth != 8 or ctype not in (2, 6) or interlace:
                raise ValueError(f"{path}: PNG kind depth={depth} colour={ctype} not handled")
        elif kind == b"IDAT":
            idat += body
        elif kind == b"IEND":
            break
    bpp = 4 if ctype == 6 else 3
    raw = zlib.decompress(idat)
    stride = width * bpp
    rows, prev, i = [], bytearray(stride), 0
    for _ in range(height):
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
        rows.append([tuple(line[k:k + bpp]) + ((255,) if bpp == 3 else ()) for k in range(0, stride, bpp)])
        prev = line
    return width, height, rows


def fit(pairs):
    """Least-squares value = a + b * pixel through (pixel, value) pairs; returns
    (a, b, largest residual)."""
    n = len(pairs)
    sx = sum(p for p, _ in pairs)
    sy = sum(v for _, v in pairs)
    sxx = sum(p * p for p, _ in pairs)
    sxy = sum(p * v for p, v in pairs)
    b = (n * sxy - sx * sy) / (n * sxx - sx * sx)
    a = (sy - b * sx) / n
    return a, b, max(abs(a + b * p - v) for p, v in pairs)


def panel_axes(panel, log_y=False):
    """The x and y maps of a panel group, from its tick marks and labels:
    returns (xmap, ymap, xres, yres) with value = map(pixel)."""
    xs, ys = [], []
    for g in panel.iter(SVG + "g"):
        cls = g.get("class")
        if cls not in ("xtick", "ytick"):
            continue
        mark = [l for l in g.findall(SVG + "line") if l.get("class") == "mark"][0]
        label = float(g.find(SVG + "text").text)
        if cls == "xtick":
            xs.append((float(mark.get("x1")), label))
        else:
            ys.append((float(mark.get("y1")), (__import__("math").log10(label) if log_y else label)))
    ax, bx, rx = fit(xs)
    ay, by, ry = fit(ys)
    return (lambda px: ax + bx * px), (lambda py: ay + by * py), (rx, bx), (ry, by)


def path_points(d):
    """Vertices of an SVG path written as M/L commands (l0,0 dots skipped)."""
    pts = []
    for cmd, x, y in re.findall(r"([MLl])\s*(-?[0-9.]+),(-?[0-9.]+)", d):
        if cmd != "l":
            pts.append((float(x), float(y)))
    return pts
