#!/usr/bin/env python3
"""Reference scorer for Hairline's src/docs/metrics.md, written the plain per-class way with numpy + scipy.

It shares no code with the app. Each score follows its published source:
  * confusion, IoU family: Long, Shelhamer, Darrell, FCN, CVPR 2015 sec. 5; void truth left out
    (Everingham et al., PASCAL VOC, IJCV 2010); predictions that are no class id go to an extra column.
  * band (trimap) scores: d = scipy.ndimage.distance_transform_edt to the truth boundary
    (4-neighbour inside the image with a different truth value, void included), Band(w) = {d <= w}
    (Kohli, Ladicky, Torr, IJCV 2009).
  * Boundary IoU: Cheng et al., CVPR 2021; scipy.ndimage.binary_erosion with a 3x3 square,
    iterations = dil, border_value = 0; void truth removed after the bands are made.
  * Boundary F: Csurka, Larlus, Perronnin, BMVC 2013; tolerance theta = ratio * diagonal, distances
    from distance_transform_edt; frame BF = mean over classes, dataset BF = mean over frames.
Truth ids that are not class ids are scored as void.

Usage:
  metrics_ref.py --truth DIR --pred DIR [--classes FILE] [--ignore N] [--biou-ratio R] [--bf-tolerance T]
      PNG label maps paired by file name; without --classes every id seen (except ignore) is a class.
  metrics_ref.py --frames FILE.json
      {"classes": [{"id", "name"}], "ignore", "biouDilationRatio", "bfTolerance",
       "frames": [{"name", "width", "height", "truth" | "truthFile", "pred" | "predFile", "error"?}]}
      "truth"/"pred" are row-major id lists; "...File" are raw little-endian uint16 files (path
      relative to the JSON file). A frame with "error" is reported failed as given.
  --time N  also time each score family N times per frame; adds "timing": median wall ms per frame
            per family and "total", and "cpuTotal" (process CPU ms, steadier on a busy machine).
Prints the report JSON (src/docs/metrics.md "What the scorer prints") on stdout.
"""
import argparse
import json
import math
import os
import re
import sys
import time

import numpy as np
from scipy import ndimage

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from png_ref import PngError, png_read_ids  # noqa: E402

BAND_WIDTHS = range(0, 65)
SQUARE = np.ones((3, 3), dtype=bool)


def edges_of(values):
    """Pixels with a 4-neighbour inside the image of a different value (the border is no boundary)."""
    e = np.zeros(values.shape, dtype=bool)
    dh = values[:, 1:] != values[:, :-1]
    e[:, 1:] |= dh
    e[:, :-1] |= dh
    dv = values[1:, :] != values[:-1, :]
    e[1:, :] |= dv
    e[:-1, :] |= dv
    return e


def distance_to(mask):
    """Euclidean distance from every pixel to the nearest True pixel of `mask` (inf if none)."""
    if not mask.any():
        return np.full(mask.shape, np.inf)
    return ndimage.distance_transform_edt(~mask)


def confusion_of(t_index, p_index, select, k):
    """K x (K+1) confusion of the selected pixels (rows truth class, column K = invalid prediction)."""
    cells = t_index[select] * (k + 1) + p_index[select]
    return np.bincount(cells, minlength=k * (k + 1)).reshape(k, k + 1).astype(np.int64)


def indices_of(ids, class_ids, k):
    """Class index of every pixel, or -1 where the id is no class id."""
    out = np.full(ids.shape, -1, dtype=np.int64)
    for c, cid in enumerate(class_ids):
        out[ids == cid] = c
    return out


def frame_counts(gt, pr, class_ids, ignore, ratio, tol, timing=None):
    """Returns the additive counts of one frame (confusion, band confusions, Boundary IoU, Boundary F)."""
    h, w = gt.shape
    k = len(class_ids)
    clock, cpu = {}, {}

    def tick(key, t0, c0):
        clock[key] = time.perf_counter() - t0
        cpu[key] = time.process_time() - c0

    t0, c0 = time.perf_counter(), time.process_time()
    t_index = indices_of(gt, class_ids, k)
    valid = (t_index >= 0) & (gt != ignore)
    p_index = indices_of(pr, class_ids, k)
    p_index[p_index < 0] = k
    conf = confusion_of(t_index, p_index, valid, k)
    tick("confusion", t0, c0)

    t0, c0 = time.perf_counter(), time.process_time()
    d = distance_to(edges_of(gt))
    band = [confusion_of(t_index, p_index, valid & (d <= wd), k) for wd in BAND_WIDTHS]
    tick("band", t0, c0)

    diag = math.sqrt(w * w + h * h)
    t0, c0 = time.perf_counter(), time.process_time()
    dil = max(1, int(round(ratio * diag)))  # Python's round: half to even, as the paper's code
    inter, union = np.zeros(k, np.int64), np.zeros(k, np.int64)
    for c, cid in enumerate(class_ids):
        g, p = gt == cid, pr == cid
        gd = g & ~ndimage.binary_erosion(g, structure=SQUARE, iterations=dil, border_value=0)
        pd = p & ~ndimage.binary_erosion(p, structure=SQUARE, iterations=dil, border_value=0)
        gd &= valid
        pd &= valid
        inter[c] = np.count_nonzero(gd & pd)
        union[c] = np.count_nonzero(gd | pd)
    tick("boundaryIoU", t0, c0)

    t0, c0 = time.perf_counter(), time.process_time()
    theta = tol * diag
    bf = np.zeros((4, k), np.int64)  # pred matched, pred total, truth matched, truth total
    for c, cid in enumerate(class_ids):
        g, p = gt == cid, pr == cid
        gb = g & edges_of(g)
        pb = p & edges_of(p) & valid
        bf[1, c], bf[3, c] = np.count_nonzero(pb), np.count_nonzero(gb)
        if bf[1, c] and bf[3, c]:
            bf[0, c] = np.count_nonzero(distance_to(gb)[pb] <= theta)
            bf[2, c] = np.count_nonzero(distance_to(pb)[gb] <= theta)
    tick("boundaryF", t0, c0)

    if timing is not None:
        for key, v in clock.items():
            timing.setdefault(key, []).append(v * 1000.0)
        timing.setdefault("total", []).append(sum(clock.values()) * 1000.0)
        timing.setdefault("cpuTotal", []).append(sum(cpu.values()) * 1000.0)
    return {"confusion": conf, "band": band, "inter": inter, "union": union, "bf": bf}


def iou_family(m):
    """FCN sec. 5 scores of a K x (K+1) confusion; None where undefined; means skip undefined."""
    k = m.shape[0]
    tp = np.array([m[c, c] for c in range(k)], dtype=np.int64)
    t = m.sum(axis=1)  # truth pixels per class, invalid predictions included
    pred = m[:, :k].sum(axis=0)
    fn, fp = t - tp, pred - tp
    ious = [float(tp[c]) / float(tp[c] + fp[c] + fn[c]) if tp[c] + fp[c] + fn[c] > 0 else None for c in range(k)]
    accs = [float(tp[c]) / float(t[c]) if t[c] > 0 else None for c in range(k)]
    total = int(t.sum())
    defined = [v for v in ious if v is not None]
    defined_acc = [v for v in accs if v is not None]
    return {
        "tp": tp, "fp": fp, "fn": fn, "iou": ious,
        "pixelAccuracy": float(tp.sum()) / total if total else None,
        "meanAccuracy": sum(defined_acc) / len(defined_acc) if defined_acc else None,
        "meanIoU": sum(defined) / len(defined) if defined else None,
        "fwIoU": sum(float(t[c]) * ious[c] for c in range(k) if ious[c] is not None) / total if total else None,
    }


def frame_bf(bf):
    """Frame Boundary F: mean over classes of F = 2PR/(P+R), 0 if one side is empty or P = R = 0
    (common practice: the limit of 2PR/(P+R)), classes with no boundary on either side skipped."""
    values = []
    for c in range(bf.shape[1]):
        pm, pt, gm, gt = (int(v) for v in bf[:, c])
        if pt == 0 and gt == 0:
            continue
        prec = pm / pt if pt else 0.0
        rec = gm / gt if gt else 0.0
        values.append(2 * prec * rec / (prec + rec) if prec + rec > 0 else 0.0)
    return sum(values) / len(values) if values else None


def ratio_mean(num, den):
    values = [float(a) / float(b) for a, b in zip(num, den) if b > 0]
    return (sum(values) / len(values) if values else None), [float(a) / float(b) if b > 0 else None for a, b in zip(num, den)]


def report(classes, class_ids, settings, frames, timing):
    k = len(class_ids)
    conf = np.zeros((k, k + 1), np.int64)
    band = [np.zeros((k, k + 1), np.int64) for _ in BAND_WIDTHS]
    inter, union = np.zeros(k, np.int64), np.zeros(k, np.int64)
    frame_miou, frame_bfs, lines = [], [], []
    for name, counts, error in frames:
        if counts is None:
            lines.append({"name": name, "meanIoU": None, "pixelAccuracy": None, "boundaryIoU": None, "boundaryF": None, "error": error})
            continue
        conf += counts["confusion"]
        for wd in BAND_WIDTHS:
            band[wd] += counts["band"][wd]
        inter += counts["inter"]
        union += counts["union"]
        fam = iou_family(counts["confusion"])
        bf = frame_bf(counts["bf"])
        if fam["meanIoU"] is not None:
            frame_miou.append(fam["meanIoU"])
        if bf is not None:
            frame_bfs.append(bf)
        lines.append({"name": name, "meanIoU": fam["meanIoU"], "pixelAccuracy": fam["pixelAccuracy"],
                      "boundaryIoU": ratio_mean(counts["inter"], counts["union"])[0], "boundaryF": bf, "error": None})
    fam = iou_family(conf)
    biou_mean, biou_values = ratio_mean(inter, union)
    names = {c["id"]: c["name"] for c in classes}
    out = {
        "classes": [{"id": cid, "name": names.get(cid, str(cid))} for cid in class_ids],
        "settings": settings,
        "dataset": {
            "pixelAccuracy": fam["pixelAccuracy"], "meanAccuracy": fam["meanAccuracy"],
            "meanIoU": fam["meanIoU"], "fwIoU": fam["fwIoU"],
            "frameMeanIoU": sum(frame_miou) / len(frame_miou) if frame_miou else None,
            "perClass": [{"id": cid, "iou": fam["iou"][c], "tp": int(fam["tp"][c]), "fp": int(fam["fp"][c]), "fn": int(fam["fn"][c])}
                         for c, cid in enumerate(class_ids)],
            "band": [{"width": wd, "meanIoU": iou_family(band[wd])["meanIoU"], "pixelAccuracy": iou_family(band[wd])["pixelAccuracy"]}
                     for wd in BAND_WIDTHS],
            "boundaryIoU": {"mean": biou_mean, "perClass": [{"id": cid, "value": biou_values[c]} for c, cid in enumerate(class_ids)]},
            "boundaryF": {"mean": sum(frame_bfs) / len(frame_bfs) if frame_bfs else None},
        },
        "frames": lines,
    }
    if timing:
        out["timing"] = {key: float(np.median(v)) for key, v in timing.items()}
    return out


def natural_key(name):
    return [(0, int(tok), len(tok)) if tok.isdigit() else (1, tok.lower(), 0) for tok in re.findall(r"\d+|\D+", name)] + [name]


def frames_from_manifest(path):
    with open(path) as f:
        m = json.load(f)
    base = os.path.dirname(os.path.abspath(path))

    def plane(fr, key, shape):
        if key + "File" in fr:
            return np.fromfile(os.path.join(base, fr[key + "File"]), dtype="<u2").astype(np.int64).reshape(shape)
        return np.array(fr[key], dtype=np.int64).reshape(shape)

    settings = {"ignore": m.get("ignore", 255), "biouDilationRatio": m.get("biouDilationRatio", 0.02), "bfTolerance": m.get("bfTolerance", 0.0075)}
    items = []
    for fr in m["frames"]:
        if fr.get("error"):
            items.append((fr["name"], None, None, fr["error"]))
            continue
        shape = (fr["height"], fr["width"])
        items.append((fr["name"], plane(fr, "truth", shape), plane(fr, "pred", shape), None))
    classes = m["classes"]
    return classes, [c["id"] for c in classes], settings, items


def frames_from_dirs(args):
    table = None
    if args.classes:
        with open(args.classes) as f:
            table = json.load(f)
    ignore = args.ignore if args.ignore is not None else (table or {}).get("ignore", 255)
    colour_ids = None
    if table:
        colour_ids = {int(c["color"][1:], 16): c["id"] for c in table["classes"] if "color" in c}
        if table.get("ignoreColor"):
            colour_ids[int(table["ignoreColor"][1:], 16)] = ignore
    stems = sorted((os.path.splitext(n)[0] for n in os.listdir(args.truth) if n.lower().endswith(".png")), key=natural_key)
    items = []
    for stem in stems:
        tpath, ppath = os.path.join(args.truth, stem + ".png"), os.path.join(args.pred, stem + ".png")
        try:
            gt = png_read_ids(tpath, colour_ids)
        except (PngError, OSError, ValueError) as e:
            items.append((stem, None, None, "%s: %s" % (tpath, e)))
            continue
        if not os.path.exists(ppath):
            items.append((stem, None, None, "%s: no prediction file" % ppath))
            continue
        try:
            pr = png_read_ids(ppath, colour_ids)
        except (PngError, OSError, ValueError) as e:
            items.append((stem, None, None, "%s: %s" % (ppath, e)))
            continue
        if pr.shape != gt.shape:
            items.append((stem, None, None, "%s: prediction is %dx%d but ground truth is %dx%d" % (ppath, pr.shape[1], pr.shape[0], gt.shape[1], gt.shape[0])))
            continue
        items.append((stem, gt, pr, None))
    if table:
        classes = [{"id": c["id"], "name": c.get("name", str(c["id"]))} for c in table["classes"]]
    else:
        seen = set()
        for _, gt, pr, _ in items:
            if gt is not None:
                seen.update(np.unique(gt).tolist())
                seen.update(np.unique(pr).tolist())
        classes = [{"id": i, "name": str(i)} for i in sorted(seen) if i != ignore]
    classes.sort(key=lambda c: c["id"])
    settings = {"ignore": ignore, "biouDilationRatio": args.biou_ratio, "bfTolerance": args.bf_tolerance}
    return classes, [c["id"] for c in classes], settings, items


def main(argv):
    ap = argparse.ArgumentParser(description="Reference scorer for src/docs/metrics.md (numpy + scipy).")
    ap.add_argument("--frames")
    ap.add_argument("--truth")
    ap.add_argument("--pred")
    ap.add_argument("--classes")
    ap.add_argument("--ignore", type=int)
    ap.add_argument("--biou-ratio", type=float, default=0.02)
    ap.add_argument("--bf-tolerance", type=float, default=0.0075)
    ap.add_argument("--time", type=int, default=0)
    args = ap.parse_args(argv)
    if args.frames:
        classes, class_ids, settings, items = frames_from_manifest(args.frames)
    elif args.truth and args.pred:
        classes, class_ids, settings, items = frames_from_dirs(args)
    else:
        ap.error("give --frames FILE, or --truth DIR and --pred DIR")
    timing = {} if args.time > 0 else None
    frames = []
    for name, gt, pr, error in items:
        if gt is None:
            frames.append((name, None, error))
            continue
        counts = None
        for _ in range(max(1, args.time)):
            counts = frame_counts(gt, pr, class_ids, settings["ignore"], settings["biouDilationRatio"], settings["bfTolerance"], timing)
        frames.append((name, counts, None))
    json.dump(report(classes, class_ids, settings, frames, timing), sys.stdout)
    sys.stdout.write("\n")


if __name__ == "__main__":
    main(sys.argv[1:])
