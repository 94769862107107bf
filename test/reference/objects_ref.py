#!/usr/bin/env python3
"""Reference for Hairline's flicker and object scores (src/docs/metrics.md "Flicker", "Objects",
"Instance-weighted IoU"), written the plain way with numpy + scipy; it shares no code with the app.

  * objects: scipy.ndimage.label on each class's truth mask with a 3x3 structure of ones
    (8-connectivity); recall of an object = share of its pixels predicted as its class.
  * iIoU: Cordts et al., "The Cityscapes Dataset for Semantic Urban Scene Understanding", CVPR 2016,
    sec. 3.2: per instance, TP and FN pixels weighted by (mean instance size of the class) / (instance
    size); FP unweighted from the confusion matrix. Here the mean instance size is taken over the
    instances of the frames given.
  * flip-back: per frame t with neighbours in its sequence (keys differing only in their last number,
    frames in the order given): share of pixels with pred[t-1] == pred[t+1] != pred[t].

Input (stdin JSON): {"classIds", "ignore", "frames": [{"name", "width", "height", "truth", "pred",
"instances"?}]} with row-major id lists. Prints JSON on stdout.
"""
import json
import re
import sys

import numpy as np
from scipy import ndimage

EDGES = [1, 16, 64, 256, 1024, 4096]


def seq_key(name):
    m = list(re.finditer(r"\d+", name))
    if not m:
        return None
    last = m[-1]
    return name[: last.start()] + "|" + name[last.end():]


def main():
    spec = json.load(sys.stdin)
    class_ids = spec["classIds"]
    frames = spec["frames"]
    k = len(class_ids)
    bins = np.zeros((k, len(EDGES)), dtype=np.int64)
    recall_sum = np.zeros((k, len(EDGES)))
    detected = np.zeros((k, len(EDGES)), dtype=np.int64)
    inst_n = np.zeros(k)
    inst_pixels = np.zeros(k)
    inst_recall = np.zeros(k)
    fp = np.zeros(k)
    out_frames = []
    maps = []
    for f in frames:
        shape = (f["height"], f["width"])
        gt = np.array(f["truth"], dtype=np.int64).reshape(shape)
        pr = np.array(f["pred"], dtype=np.int64).reshape(shape)
        maps.append((gt, pr))
        objects = []
        for c, cid in enumerate(class_ids):
            lab, n = ndimage.label(gt == cid, structure=np.ones((3, 3), dtype=bool))
            if n == 0:
                continue
            area = np.bincount(lab.ravel(), minlength=n + 1)[1:]
            hit = np.bincount(lab.ravel(), weights=(pr == cid).ravel().astype(float), minlength=n + 1)[1:]
            for a, h in zip(area, hit):
                b = max(i for i, e in enumerate(EDGES) if a >= e)
                r = h / a
                bins[c, b] += 1
                recall_sum[c, b] += r
                detected[c, b] += 1 if r >= 0.5 else 0
                objects.append({"classId": cid, "area": int(a), "hits": int(h)})
        small = [o["hits"] / o["area"] for o in objects if o["area"] < 1024]
        valid = np.isin(gt, class_ids)
        for c, cid in enumerate(class_ids):
            fp[c] += np.sum(valid & (gt != cid) & (pr == cid))
        if "instances" in f:
            inst = np.array(f["instances"], dtype=np.int64).reshape(shape)
            for c, cid in enumerate(class_ids):
                mask = (gt == cid) & (inst != 0)
                for i in np.unique(inst[mask]):
                    m = mask & (inst == i)
                    size = m.sum()
                    inst_n[c] += 1
                    inst_pixels[c] += size
                    inst_recall[c] += np.sum(m & (pr == cid)) / size
        out_frames.append({"name": f["name"], "objects": sorted(objects, key=lambda o: (o["classId"], o["area"], o["hits"])),
                           "smallObjectRecall": (sum(small) / len(small)) if small else None})
    keys = [seq_key(f["name"]) for f in frames]
    sums = {"flips": 0, "pixels": 0, "flipsVoid": 0, "pixelsVoid": 0}
    for t in range(len(frames)):
        fb = {"flipBack": None, "flipBackVoid": None}
        if 0 < t < len(frames) - 1 and keys[t] is not None and keys[t - 1] == keys[t] == keys[t + 1]:
            gt = maps[t][0]
            a, b, c = maps[t - 1][1], maps[t][1], maps[t + 1][1]
            flip = (a == c) & (b != a)
            valid = np.isin(gt, class_ids)
            sums["flips"] += int(flip[valid].sum())
            sums["pixels"] += int(valid.sum())
            sums["flipsVoid"] += int(flip[~valid].sum())
            sums["pixelsVoid"] += int((~valid).sum())
            if valid.any():
                fb["flipBack"] = float(flip[valid].mean())
            if (~valid).any():
                fb["flipBackVoid"] = float(flip[~valid].mean())
            fb["classFlipBack"] = [float(flip[valid & (a == cid)].mean()) if (valid & (a == cid)).any() else None for cid in class_ids]
        out_frames[t].update(fb)

    def bins_of(obj, rs, det):
        return [{"minArea": EDGES[b], "maxArea": EDGES[b + 1] if b + 1 < len(EDGES) else None, "objects": int(obj[b]),
                 "meanRecall": float(rs[b] / obj[b]) if obj[b] else None, "detected": float(det[b] / obj[b]) if obj[b] else None}
                for b in range(len(EDGES))]

    iiou = []
    for c in range(k):
        if inst_n[c] == 0:
            iiou.append(None)
            continue
        mean = inst_pixels[c] / inst_n[c]
        tp = mean * inst_recall[c]
        fn = mean * (inst_n[c] - inst_recall[c])
        iiou.append(float(tp / (tp + fp[c] + fn)) if tp + fp[c] + fn > 0 else None)
    defined = [v for v in iiou if v is not None]
    print(json.dumps({
        "frames": out_frames,
        "objectsBySize": bins_of(bins.sum(0), recall_sum.sum(0), detected.sum(0)),
        "objectsBySizePerClass": [bins_of(bins[c], recall_sum[c], detected[c]) for c in range(k)],
        "iIoU": {"perClass": iiou, "mean": (sum(defined) / len(defined)) if defined else None},
        "flipBack": sums["flips"] / sums["pixels"] if sums["pixels"] else None,
        "flipBackVoid": sums["flipsVoid"] / sums["pixelsVoid"] if sums["pixelsVoid"] else None,
    }))


if __name__ == "__main__":
    main()
