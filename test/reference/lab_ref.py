"""CIELAB (D65) colour bins of Hairline's appearance histograms, computed independently with numpy.

sRGB decoding per IEC 61966-2-1 (linear below 0.04045, else ((c + 0.055) / 1.055) ** 2.4), the sRGB
primaries' RGB -> XYZ matrix and the D65 white from the same standard, and CIE 1976 L*a*b*
(CIE 15:2004, f(t) = t^(1/3) above (6/29)^3, else t / (3 (6/29)^2) + 4/29).

Prints JSON: for every 5-bit-per-channel cell (index r<<10 | g<<5 | b, colour (8 v + 4) / 255), its
bin and whether its L*, a* or b* lies within `margin` of a bin edge (where two conversions may
rightly disagree).
"""
import json
import sys

import numpy as np

L_EDGES = [25, 50, 75]
AB_EDGES = [-25, -10, 0, 10, 25]


def srgb_to_lab(rgb):
    c = np.where(rgb <= 0.04045, rgb / 12.92, ((rgb + 0.055) / 1.055) ** 2.4)
    m = np.array([[0.4124, 0.3576, 0.1805], [0.2126, 0.7152, 0.0722], [0.0193, 0.1192, 0.9505]])
    xyz = c @ m.T
    white = np.array([0.9505, 1.0, 1.0890])
    t = xyz / white
    d = 6 / 29
    f = np.where(t > d ** 3, np.cbrt(t), t / (3 * d * d) + 4 / 29)
    l = 116 * f[:, 1] - 16
    a = 500 * (f[:, 0] - f[:, 1])
    b = 200 * (f[:, 1] - f[:, 2])
    return l, a, b


def main():
    margin = float(sys.argv[1]) if len(sys.argv) > 1 else 0.5
    v = (np.arange(32) * 8 + 4) / 255.0
    r, g, b = np.meshgrid(v, v, v, indexing='ij')
    rgb = np.stack([r.ravel(), g.ravel(), b.ravel()], axis=1)
    l, a, bb = srgb_to_lab(rgb)
    li = np.searchsorted(L_EDGES, l, side='right')
    ai = np.searchsorted(AB_EDGES, a, side='right')
    bi = np.searchsorted(AB_EDGES, bb, side='right')
    bins = li * 36 + ai * 6 + bi

    def near(x, edges):
        return np.min(np.abs(x[:, None] - np.array(edges)[None, :]), axis=1) < margin

    edge = near(l, L_EDGES) | near(a, AB_EDGES) | near(bb, AB_EDGES)
    red = srgb_to_lab(np.array([[1.0, 0.0, 0.0]]))
    json.dump({'bins': bins.tolist(), 'nearEdge': edge.astype(int).tolist(), 'red': [float(x[0]) for x in red]}, sys.stdout)


main()
