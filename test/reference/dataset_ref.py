#!/usr/bin/env python3
"""Reference scorer for a dataset whose label files store ids other than class ids, written with numpy.

It shares no code with the app. The caller (a test that built the dataset) names each frame's files;
this script applies the id maps of classes.json by hand (a numpy look-up table: "truthIds" and
"predictionIds" map a stored id to a class id or null = void, the extra ids of an "ignore" list are
void), scales a prediction stored at 1/k of the truth's size up by pixel repetition (nearest
neighbour, np.repeat), and scores with the IoU family of metrics_ref.py (Long, Shelhamer, Darrell,
FCN, CVPR 2015 sec. 5; void truth left out as in Everingham et al., PASCAL VOC, IJCV 2010; predicted
ids that are no class go to an extra column).

Usage: dataset_ref.py FRAMES.json
  {"classes": "path/classes.json", "frames": [{"name", "truth": "path.png", "pred": "path.png"}]}
Prints {"dataset": {"meanIoU", "pixelAccuracy", "perClass": [{"id", "iou"}]},
        "frames": [{"name", "meanIoU", "pixelAccuracy"}]}.
"""
import json
import os
import sys

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from metrics_ref import confusion_of, indices_of, iou_family  # noqa: E402
from png_ref import png_read_ids  # noqa: E402


def id_lut(pairs, ignore):
    """Stored id -> class id (void -> ignore, not listed -> -1) as a 65536-entry array."""
    lut = np.full(65536, -1, dtype=np.int64)
    for stored, cls in pairs.items():
        lut[int(stored)] = ignore if cls is None else cls
    return lut


def main(path):
    with open(path) as f:
        spec = json.load(f)
    with open(spec["classes"]) as f:
        table = json.load(f)
    ignores = table.get("ignore", 255)
    ignores = ignores if isinstance(ignores, list) else [ignores]
    ignore = ignores[0]
    class_ids = sorted(c["id"] for c in table["classes"])
    k = len(class_ids)
    truth_pairs = dict(table.get("truthIds") or {})
    if len(ignores) > 1 and not truth_pairs:
        truth_pairs = {str(c): c for c in class_ids}
        truth_pairs[str(ignore)] = None
    for extra in ignores[1:]:
        truth_pairs.setdefault(str(extra), None)
    truth_lut = id_lut(truth_pairs, ignore) if truth_pairs else None
    pred_lut = id_lut(table["predictionIds"], ignore) if table.get("predictionIds") else None
    total = np.zeros((k, k + 1), np.int64)
    lines = []
    for fr in spec["frames"]:
        gt = png_read_ids(fr["truth"])
        pr = png_read_ids(fr["pred"])
        if truth_lut is not None:
            gt = truth_lut[gt]
            if (gt < 0).any():
                raise SystemExit("%s: stored id not in truthIds" % fr["truth"])
        if pred_lut is not None:
            pr = pred_lut[pr]  # -1 where not listed: no class, counted in the extra column
        if pr.shape != gt.shape:
            fy, fx = gt.shape[0] // pr.shape[0], gt.shape[1] // pr.shape[1]
            pr = np.repeat(np.repeat(pr, fy, axis=0), fx, axis=1)
        valid = gt != ignore
        t_index = indices_of(gt, class_ids, k)
        p_index = indices_of(pr, class_ids, k)
        p_index[p_index < 0] = k
        m = confusion_of(t_index, p_index, valid & (t_index >= 0), k)
        total += m
        fam = iou_family(m)
        lines.append({"name": fr["name"], "meanIoU": fam["meanIoU"], "pixelAccuracy": fam["pixelAccuracy"]})
    fam = iou_family(total)
    out = {
        "dataset": {"meanIoU": fam["meanIoU"], "pixelAccuracy": fam["pixelAccuracy"],
                    "perClass": [{"id": cid, "iou": fam["iou"][c]} for c, cid in enumerate(class_ids)]},
        "frames": lines,
    }
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main(sys.argv[1])
