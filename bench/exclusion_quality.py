#!/usr/bin/env python3
"""Exclusion quality of a finished scan against exact labels.

Reads an exactly labelled file and a scan's survivor files, and reports the recall of true targets
(labelled configurations inside every range) and the rejection of the others. Only the rows present in
the labels count. Three-fold labels are config, h11, h21, ... with chi = 2 (h11 - h21); four-fold labels
(a header naming h31 and h22) are config, h11, h21, h31, h22, ... with chi = 48 + 6 (h11 - h21 + h31)
(the identity of full holonomy; the label files hold non-products only).

Usage: exclusion_quality.py LABELS.tsv SCAN_DIR h11=LO..HI chi=LO..HI [h31=LO..HI ...]
"""
import glob
import os
import sys


def ranges(args):
    out = {}
    for a in args:
        name, span = a.split("=")
        lo, hi = span.split("..")
        out[name] = (int(lo) if lo else -10**18, int(hi) if hi else 10**18)
    return out


def main():
    if len(sys.argv) < 4:
        sys.exit(__doc__)
    labels, scan_dir, keep = sys.argv[1], sys.argv[2], ranges(sys.argv[3:])
    survivors = set()
    for path in glob.glob(os.path.join(scan_dir, "survivors*")):
        with open(path, encoding="utf-8") as f:
            for line in f:
                if line.startswith("#") or line.startswith("config\t") or not line.strip():
                    continue
                survivors.add(line.split("\t")[0])
    targets = kept_targets = others = rejected_others = 0
    with open(labels, encoding="utf-8") as f:
        header = next(f).rstrip("\n").split("\t")
        four = len(header) > 4 and header[3] == "h31" and header[4] == "h22"
        for line in f:
            fields = line.rstrip("\n").split("\t")
            cfg, h11, h21 = fields[0], int(fields[1]), int(fields[2])
            if four:
                h31, h22 = int(fields[3]), int(fields[4])
                value = {"h11": h11, "h21": h21, "h31": h31, "h22": h22, "chi": 48 + 6 * (h11 - h21 + h31)}
            else:
                value = {"h11": h11, "h21": h21, "chi": 2 * (h11 - h21)}
            target = all(lo <= value[k] <= hi for k, (lo, hi) in keep.items())
            if target:
                targets += 1
                kept_targets += cfg in survivors
            else:
                others += 1
                rejected_others += cfg not in survivors
    print(f"true targets: {targets}")
    print(f"others: {others}")
    print(f"target recall: {kept_targets / targets:.4f}")
    print(f"non-target rejection: {rejected_others / others:.4f}")


if __name__ == "__main__":
    main()
