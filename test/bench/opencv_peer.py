#!/usr/bin/env python3
"""A second, independent implementation of src/docs/metrics.md's per-frame counts, written the way a
computer-vision engineer would with OpenCV + numpy, used by test/bench/endToEnd.bench.ts as the speed
peer: it decodes the same PNG files (cv2.imread) and computes the same counts, which the bench checks
equal Hairline's before comparing times.

  * confusion: a look-up table from id to class index, then one np.bincount.
  * band histogram: cv2.distanceTransform(DIST_L2, DIST_MASK_PRECISE) (exact Euclidean distance) to
    the truth boundary (4-neighbour of a different truth id), bin min(ceil(d), 65), one np.bincount.
  * Boundary IoU (Cheng et al., CVPR 2021): erosion of each class mask by a 3x3 square `dil` times
    equals one (2 dil + 1)^2 square; a pixel is in its own class's inner band exactly when the minimum
    and maximum class index over that square differ (outside the image padded so they differ), so one
    cv2.erode and one cv2.dilate of the index map serve every class.
  * Boundary F (Csurka et al., BMVC 2013): per class, an exact distance transform of the other side's
    boundary cropped to the bounding box of the points queried, grown by the tolerance (a point within
    theta of the boundary has that boundary point inside the crop).

Usage: opencv_peer.py --frames FILE.json [--reps N]
  FILE.json: {"classes": [ids], "ignore", "biouDilationRatio", "bfTolerance", "frames": [{"truth", "pred"}]}
  (PNG paths). Prints JSON: per frame the counts (flat lists, FrameStats order) and the median wall ms
  per frame of decode (both PNGs), scores and their sum, over N repetitions.
"""
import argparse
import json
import math
import sys
import time

import cv2
import numpy as np

BAND_BINS = 66


def has_other_neighbour(v):
    """Pixels with a 4-neighbour inside the image of a different value (edge padding: the border is none)."""
    q = np.pad(v, 1, mode="edge")
    c = q[1:-1, 1:-1]
    return (q[:-2, 1:-1] != c) | (q[2:, 1:-1] != c) | (q[1:-1, :-2] != c) | (q[1:-1, 2:] != c)


def squared_limit(theta):
    """Largest integer n with sqrt(n) <= theta (a squared distance is within theta exactly when <= n)."""
    n = math.floor(theta * theta)
    while math.sqrt(n + 1) <= theta:
        n += 1
    while n >= 0 and math.sqrt(n) > theta:
        n -= 1
    return n


def matched_within(targets, queries, shape, r2, r):
    """How many of `queries` ((ys, xs)) lie within sqrt(r2) of some point of `targets`."""
    qy, qx = queries
    if len(qy) == 0:
        return 0
    ty, tx = targets
    if len(ty) == 0:
        return 0
    h, w = shape
    y0, y1 = max(0, int(qy.min()) - r - 1), min(h, int(qy.max()) + r + 2)
    x0, x1 = max(0, int(qx.min()) - r - 1), min(w, int(qx.max()) + r + 2)
    inside = (ty >= y0) & (ty < y1) & (tx >= x0) & (tx < x1)
    if not inside.any():
        return 0
    crop = np.ones((y1 - y0, x1 - x0), np.uint8)
    crop[ty[inside] - y0, tx[inside] - x0] = 0
    d = cv2.distanceTransform(crop, cv2.DIST_L2, cv2.DIST_MASK_PRECISE)
    dq = d[qy - y0, qx - x0].astype(np.float64)
    return int(np.count_nonzero(np.rint(dq * dq) <= r2))


def frame_counts(gt, pr, class_ids, ignore, ratio, tol):
    h, w = gt.shape
    k = len(class_ids)
    lut = np.full(65536, k, np.uint8)
    for c, cid in enumerate(class_ids):
        lut[cid] = c
    t = lut[gt]
    p = lut[pr]
    valid = t < k
    cells = t.astype(np.int32) * (k + 1) + p

    # Band: exact distance to the truth boundary, binned.
    edge = has_other_neighbour(gt)
    if edge.any():
        d = cv2.distanceTransform((~edge).astype(np.uint8), cv2.DIST_L2, cv2.DIST_MASK_PRECISE)
        b = np.minimum(np.ceil(d), BAND_BINS - 1).astype(np.int32)
    else:
        b = np.full(gt.shape, BAND_BINS - 1, np.int32)
    stride = k * (k + 1)
    band = np.bincount((b * stride + cells)[valid], minlength=BAND_BINS * stride)
    confusion = band.reshape(BAND_BINS, stride).sum(axis=0)

    # Boundary IoU: one erode and one dilate of the index maps (1..k+1), the border padded 0 / 255.
    diag = math.sqrt(w * w + h * h)
    dil = max(1, int(round(ratio * diag)))
    kernel = np.ones((2 * dil + 1, 2 * dil + 1), np.uint8)
    t1, p1 = t + 1, p + 1

    def inner(v):
        lo = cv2.erode(v, kernel, borderType=cv2.BORDER_CONSTANT, borderValue=0)
        hi = cv2.dilate(v, kernel, borderType=cv2.BORDER_CONSTANT, borderValue=255)
        return lo != hi

    tb = inner(t1) & valid
    pb = inner(p1) & valid & (p < k)
    gd = np.bincount(t[tb], minlength=k + 1)[:k]
    pd = np.bincount(p[pb], minlength=k + 1)[:k]
    inter = np.bincount(t[tb & pb & (t == p)], minlength=k + 1)[:k]
    union = gd + pd - inter

    # Boundary F: class-mask boundaries, then per class a cropped exact distance transform each way.
    theta = tol * diag
    r2 = squared_limit(theta)
    r = int(math.ceil(math.sqrt(max(r2, 0))))
    gt_edge = has_other_neighbour(t) & (t < k)
    pr_edge = has_other_neighbour(p) & (p < k) & valid
    gy, gx = np.nonzero(gt_edge)
    gc = t[gy, gx]
    py, px = np.nonzero(pr_edge)
    pc = p[py, px]
    g_order, p_order = np.argsort(gc, kind="stable"), np.argsort(pc, kind="stable")
    gy, gx, gc = gy[g_order], gx[g_order], gc[g_order]
    py, px, pc = py[p_order], px[p_order], pc[p_order]
    g_at = np.searchsorted(gc, np.arange(k + 1))
    p_at = np.searchsorted(pc, np.arange(k + 1))
    bf = np.zeros((4, k), np.int64)
    for c in range(k):
        g = (gy[g_at[c]:g_at[c + 1]], gx[g_at[c]:g_at[c + 1]])
        q = (py[p_at[c]:p_at[c + 1]], px[p_at[c]:p_at[c + 1]])
        bf[1, c], bf[3, c] = len(q[0]), len(g[0])
        if bf[1, c] and bf[3, c]:
            bf[0, c] = matched_within(g, q, gt.shape, r2, r)
            bf[2, c] = matched_within(q, g, gt.shape, r2, r)
    return {
        "confusion": confusion.tolist(), "band": band.tolist(), "biouInter": inter.tolist(), "biouUnion": union.tolist(),
        "bfPredMatched": bf[0].tolist(), "bfPredTotal": bf[1].tolist(), "bfTruthMatched": bf[2].tolist(), "bfTruthTotal": bf[3].tolist(),
    }


def main(argv):
    ap = argparse.ArgumentParser()
    ap.add_argument("--frames", required=True)
    ap.add_argument("--reps", type=int, default=5)
    args = ap.parse_args(argv)
    with open(args.frames) as f:
        m = json.load(f)
    class_ids = m["classes"]
    decode, scores, total, out = [], [], [], []
    cv2.setNumThreads(1)  # one thread, as the comparison says
    for rep in range(args.reps + 1):
        for fr in m["frames"]:
            t0 = time.perf_counter()
            gt = cv2.imread(fr["truth"], cv2.IMREAD_UNCHANGED)
            pr = cv2.imread(fr["pred"], cv2.IMREAD_UNCHANGED)
            t1 = time.perf_counter()
            counts = frame_counts(gt, pr, class_ids, m["ignore"], m["biouDilationRatio"], m["bfTolerance"])
            t2 = time.perf_counter()
            if rep == 0:
                out.append(counts)  # the first round also warms up; it is not timed
                continue
            decode.append((t1 - t0) * 1000)
            scores.append((t2 - t1) * 1000)
            total.append((t2 - t0) * 1000)
    med = lambda v: float(np.median(v))
    json.dump({"opencv": cv2.__version__, "numpy": np.__version__, "frames": out,
               "timing": {"decode": med(decode), "scores": med(scores), "total": med(total)}}, sys.stdout)
    sys.stdout.write("\n")


if __name__ == "__main__":
    main(sys.argv[1:])
