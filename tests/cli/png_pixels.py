"""Decode a PNG (8-bit RGB/RGBA, not interlaced) into a numpy array without
Pillow, for the browser test. Usage as a program: png_pixels.py FILE prints
width, height and the number of distinct colours."""
import struct
import sys
import zlib

import numpy as np


def read_png(path):
    data = open(path, "rb").read()
    if data[:8] != b"\x89PNG\r\n\x1a\n":
        raise ValueError(f"{path} is not a PNG")
    pos, idat = 8, b""
    while pos < len(data):
        length, kind = struct.unpack(">I4s", data[pos:pos + 8])
        body = data[pos + 8:pos + 8 + length]
        if kind == b"IHDR":
            width, height, depth, colour, _, _, interlace = struct.unpack(">IIBBBBB", body)
            if depth != 8 or colour not in (2, 6) or interlace:
                raise ValueError(f"unsupported PNG: depth {depth}, colour type {colour}, interlace {interlace}")
            ch = 3 if colour == 2 else 4
        elif kind == b"IDAT":
            idat += body
        pos += 12 + length
    raw = zlib.decompress(idat)
    stride = width * ch
    out = np.zeros((height, stride), dtype=np.uint8)
    prev = bytearray(stride)
    for y in range(height):
        f = raw[y * (stride + 1)]
        line = bytearray(raw[y * (stride + 1) + 1:(y + 1) * (stride + 1)])
        if f == 1:  # Sub: running sums along the row, per channel
            row = np.frombuffer(bytes(line), dtype=np.uint8).reshape(width, ch).astype(np.uint64)
            line = bytearray((np.cumsum(row, axis=0) % 256).astype(np.uint8).tobytes())
        elif f == 2:  # Up
            line = bytearray(((np.frombuffer(bytes(line), np.uint8).astype(np.uint16) +
                               np.frombuffer(bytes(prev), np.uint8)) % 256).astype(np.uint8).tobytes())
        elif f in (3, 4):  # Average, Paeth: each byte needs its left neighbour
            for x in range(stride):
                a = line[x - ch] if x >= ch else 0
                b = prev[x]
                if f == 3:
                    p = (a + b) >> 1
                else:
                    c = prev[x - ch] if x >= ch else 0
                    pa, pb, pc = abs(b - c), abs(a - c), abs(a + b - 2 * c)
                    p = a if pa <= pb and pa <= pc else (b if pb <= pc else c)
                line[x] = (line[x] + p) & 255
        out[y] = np.frombuffer(bytes(line), dtype=np.uint8)
        prev = line
    return out.reshape(height, width, ch)


if __name__ == "__main__":
    px = read_png(sys.argv[1])
    rgb = px[:, :, :3].reshape(-1, 3)
    print(px.shape[1], px.shape[0], len(np.unique(rgb, axis=0)))
