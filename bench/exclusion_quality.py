#!/usr/bin/env python3
"""Exclusion quality of a finished scan against exact labels.

Reads exact labels of every configuration of a space and a scan's survivor files, and reports the recall
of true targets (labelled configurations inside every kept range and residue) and the rejection of the
others. Only the rows present in the labels count.

The labels are either a reference TSV of `winnow label` (config, h11, h21, [h31, h22,] status, source)
or the JSON lines of `winnow hodge --json` (which carry chi and the product flag). From a TSV, chi is
2 (h11 - h21) for three-folds and 48 + 6 (h11 - h21 + h31) for four-folds; that identity does not hold
for products (source product), so four-fold labels with products need the JSON lines.

Usage: exclusion_quality.py LABELS.tsv|LABELS.jsonl SCAN_DIR RULE [RULE ...]
  RULE: NAME=LO..HI (NAME in h11, h21, h31, h22, chi; LO or HI may be left out) or NAME%M=R (e.g. chi%24=0)
"""
import glob
import json
import os
import sys


def rules(args):
    out = []
    for a in args:
        name, rhs = a.split("=")
        if "%" in name:
            name, modulus = name.split("%")
            out.append((name, "mod", int(modulus), int(rhs)))
        else:
            lo, hi = rhs.split("..")
            out.append((name, "range", int(lo) if lo else -10**18, int(hi) if hi else 10**18))
    return out


def holds(rule, value):
    name, kind, a, b = rule
    v = value[name]
    return v % a == b if kind == "mod" else a <= v <= b


def labelled(path):
    """Yields (config, values) for every exact row."""
    with open(path, encoding="utf-8") as f:
        first = f.readline()
        if first.startswith("{"):
            f.seek(0)
            for line in f:
                o = json.loads(line)
                if o.get("status") != "exact":
                    continue
                yield o["canonical"], {k: o[k] for k in ("h11", "h21", "h31", "h22", "chi") if k in o}
            return
        header = first.rstrip("\n").split("\t")
        four = "h31" in header
        for line in f:
            cols = line.rstrip("\n").split("\t")
            row = dict(zip(header, cols))
            if row["status"] != "exact":
                continue
            if four and row["source"] == "product":
                sys.exit("four-fold products in " + path + ": chi does not follow from their Hodge numbers; "
                         "give the JSON lines of winnow hodge --json instead")
            v = {k: int(row[k]) for k in ("h11", "h21", "h31", "h22") if k in row}
            v["chi"] = 48 + 6 * (v["h11"] - v["h21"] + v["h31"]) if four else 2 * (v["h11"] - v["h21"])
            yield row["config"], v


def main():
    if len(sys.argv) < 4:
        sys.exit(__doc__)
    labels, scan_dir, keep = sys.argv[1], sys.argv[2], rules(sys.argv[3:])
    survivors = set()
    for path in glob.glob(os.path.join(scan_dir, "survivors*")):
        with open(path, encoding="utf-8") as f:
            for line in f:
                if line.startswith("#") or line.startswith("config\t") or not line.strip():
                    continue
                survivors.add(line.split("\t")[0])
    targets = kept_targets = others = rejected_others = 0
    for cfg, value in labelled(labels):
        if all(holds(r, value) for r in keep):
            targets += 1
            kept_targets += cfg in survivors
        else:
            others += 1
            rejected_others += cfg not in survivors
    print(f"true targets: {targets}")
    print(f"others: {others}")
    print(f"kept targets: {kept_targets}")
    print(f"kept others: {others - rejected_others}")
    print(f"target recall: {kept_targets / targets:.4f}" if targets else "target recall: undefined (no targets)")
    print(f"non-target rejection: {rejected_others / others:.4f}" if others else "non-target rejection: undefined")


if __name__ == "__main__":
    main()
