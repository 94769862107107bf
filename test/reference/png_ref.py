"""Plain PNG reader for label maps (ISO/IEC 15948 / W3C PNG specification), standard library + numpy.

Independent of the app's decoder: chunks and CRCs (§5), zlib inflate (§10), the five scanline
filters (§9), then samples to ids: grayscale value = id, palette index = id, RGB(A) colour -> id
through a colour table. 1/2/4/8/16-bit, non-interlaced only (enough for a reference).
"""
import struct
import zlib

import numpy as np

PNG_SIGNATURE = b"\x89PNG\r\n\x1a\n"
CHANNELS = {0: 1, 2: 3, 3: 1, 4: 2, 6: 4}


class PngError(Exception):
    """A file this reader cannot read; the message says why."""


def png_chunks(data):
    """Returns the list of (type, payload) chunks, checking the signature and every CRC."""
    if data[:8] != PNG_SIGNATURE:
        raise PngError("not a PNG file (bad signature)")
    pos, chunks = 8, []
    while pos + 8 <= len(data):
        length, ctype = struct.unpack(">I4s", data[pos:pos + 8])
        payload = data[pos + 8:pos + 8 + length]
        (crc,) = struct.unpack(">I", data[pos + 8 + length:pos + 12 + length])
        if zlib.crc32(ctype + payload) & 0xFFFFFFFF != crc:
            raise PngError("chunk %s has a bad CRC" % ctype.decode("latin-1"))
        chunks.append((ctype, payload))
        pos += 12 + length
        if ctype == b"IEND":
            break
    return chunks


def paeth(a, b, c):
    p = a + b - c
    pa, pb, pc = abs(p - a), abs(p - b), abs(p - c)
    if pa <= pb and pa <= pc:
        return a
    return b if pb <= pc else c


def png_unfilter(raw, height, row_bytes, bpp):
    """Returns the reconstructed scanlines as a (height, row_bytes) uint8 array (§9.2)."""
    out = np.zeros((height, row_bytes), dtype=np.uint8)
    prev = np.zeros(row_bytes, dtype=np.uint8)
    stride = row_bytes + 1
    for y in range(height):
        ftype = raw[y * stride]
        line = np.frombuffer(raw, dtype=np.uint8, count=row_bytes, offset=y * stride + 1)
        if ftype == 0:
            cur = line.copy()
        elif ftype == 2:
            cur = ((line.astype(np.uint16) + prev) & 255).astype(np.uint8)
        elif ftype == 1:
            cur = line.astype(np.int64)
            for lane in range(bpp):
                cur[lane::bpp] = np.cumsum(cur[lane::bpp]) & 255
            cur = cur.astype(np.uint8)
        elif ftype in (3, 4):
            cur_l = bytearray(line.tobytes())
            up = prev.tolist()
            for x in range(row_bytes):
                a = cur_l[x - bpp] if x >= bpp else 0
                b = up[x]
                if ftype == 3:
                    pred = (a + b) >> 1
                else:
                    pred = paeth(a, b, up[x - bpp] if x >= bpp else 0)
                cur_l[x] = (cur_l[x] + pred) & 255
            cur = np.frombuffer(bytes(cur_l), dtype=np.uint8)
        else:
            raise PngError("row %d has unknown filter type %d" % (y, ftype))
        out[y] = cur
        prev = out[y]
    return out


def png_read_ids(path, colour_ids=None):
    """Returns the label map of the PNG at `path` as a (height, width) int64 array of ids.

    `colour_ids` maps 0xRRGGBB to an id for colour-coded RGB/RGBA maps; an unknown colour is an error
    naming the colour and how many pixels have it.
    """
    with open(path, "rb") as f:
        data = f.read()
    chunks = png_chunks(data)
    if not chunks or chunks[0][0] != b"IHDR":
        raise PngError("IHDR is not the first chunk")
    width, height, depth, ctype, _, _, interlace = struct.unpack(">IIBBBBB", chunks[0][1])
    if ctype not in CHANNELS:
        raise PngError("colour type %d is not a PNG colour type" % ctype)
    if interlace != 0:
        raise PngError("interlaced PNGs are not read by the reference")
    channels = CHANNELS[ctype]
    bits = channels * depth
    row_bytes = (width * bits + 7) // 8
    bpp = max(1, bits // 8)
    raw = zlib.decompress(b"".join(p for t, p in chunks if t == b"IDAT"))
    if len(raw) < height * (row_bytes + 1):
        raise PngError("image data is shorter than %dx%d needs" % (width, height))
    rows = png_unfilter(raw, height, row_bytes, bpp)
    if depth < 8:
        unpacked = np.unpackbits(rows, axis=1).reshape(height, -1, depth)
        weights = 1 << np.arange(depth - 1, -1, -1)
        samples = (unpacked * weights).sum(axis=2)[:, :width]
    elif depth == 8:
        samples = rows.astype(np.int64).reshape(height, width, channels)
    else:
        samples = rows.view(">u2").astype(np.int64).reshape(height, width, channels)
    if ctype in (0, 3):
        return samples.reshape(height, width).astype(np.int64)
    if ctype == 4:
        return samples[:, :, 0].astype(np.int64)
    if depth != 8:
        raise PngError("16-bit colour-coded maps are not read by the reference")
    rgb = (samples[:, :, 0] << 16) | (samples[:, :, 1] << 8) | samples[:, :, 2]
    if colour_ids is None:
        raise PngError("colour-coded (RGB) label map needs a class table with colours")
    keys = np.array(sorted(colour_ids), dtype=np.int64)
    values = np.array([colour_ids[k] for k in sorted(colour_ids)], dtype=np.int64)
    at = np.clip(np.searchsorted(keys, rgb), 0, len(keys) - 1)
    unknown = keys[at] != rgb
    if unknown.any():
        colours, counts = np.unique(rgb[unknown], return_counts=True)
        raise PngError("colour #%06x (%d pixels) is not in the class table" % (colours[0], counts[0]))
    return values[at]
