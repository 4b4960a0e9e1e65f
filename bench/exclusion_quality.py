#!/usr/bin/env python3
"""Exclusion quality of a finished scan against exact labels.

Reads an exactly labelled three-fold file (config, h11, h21, ...; chi = 2 (h11 - h21)) and a scan's
survivor files, and reports the recall of true targets (labelled configurations inside every range)
and the rejection of the others. Only the rows present in the labels count.

Usage: exclusion_quality.py LABELS.tsv SCAN_DIR h11=LO..HI chi=LO..HI [...]
"""
import glob
import os
import sys


def ranges(args):
    out = {}
    for a in args:
        name, span = a.split("=")
        lo, hi = span.split("..")
        out[name] = (int(lo), int(hi))
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
        next(f)
        for line in f:
            cfg, h11, h21 = line.rstrip("\n").split("\t")[:3]
            value = {"h11": int(h11), "h21": int(h21), "chi": 2 * (int(h11) - int(h21))}
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
