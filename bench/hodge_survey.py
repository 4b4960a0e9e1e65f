#!/usr/bin/env python3
"""Survey figures of an exact Hodge run over a space (the tables of docs/hodge-coverage.md).

Reads the JSON lines of `winnow hodge --json` and, optionally, those of `winnow invariants --json` on the
same inputs (for int c2^2), and prints: counts by status and method, refusal reasons, the ranges of h11,
h21, h31, h22 and chi for non-products and products apart, the number of distinct tuples, the h11
histogram, and the relations of full holonomy checked on every exact non-product:
  d = 4: chi = 48 + 6 (h11 - h21 + h31), h22 = 44 + 4 h11 - 2 h21 + 4 h31, int c2^2 = 480 + chi/3;
  d = 3: chi = 2 (h11 - h21).
Every relation is reported as checked / failed counts; nothing is assumed to hold.

Usage: hodge_survey.py HODGE.jsonl [INVARIANTS.jsonl]
"""
import collections
import json
import sys


def span(values):
    return f"{min(values)}..{max(values)}" if values else "-"


def main():
    if len(sys.argv) not in (2, 3):
        sys.exit(__doc__)
    c2sq = {}
    if len(sys.argv) == 3:
        with open(sys.argv[2], encoding="utf-8") as f:
            for line in f:
                o = json.loads(line)
                if o.get("c2sq") is not None:
                    c2sq[o["canonical"]] = o["c2sq"]
    status = collections.Counter()
    methods = collections.Counter()
    refusals = collections.Counter()
    dims = collections.Counter()
    groups = {False: collections.defaultdict(list), True: collections.defaultdict(list)}
    tuples = {False: set(), True: set()}
    h11_hist = {False: collections.Counter(), True: collections.Counter()}
    checks = collections.Counter()
    failures = []
    seconds = collections.defaultdict(float)
    for line in open(sys.argv[1], encoding="utf-8"):
        o = json.loads(line)
        status[o["status"]] += 1
        dims[o["dim"]] += 1
        if o["status"] == "refused":
            reason = o.get("reason", "")
            refusals[reason.split(":")[0]] += 1
            continue
        methods[o["method"]] += 1
        seconds[o["method"]] += o["seconds"]
        if o["status"] != "exact":
            continue
        product = bool(o.get("product"))
        d = o["dim"]
        names = ["h11", "h21", "h31", "h22"] if d == 4 else ["h11", "h21"] if d == 3 else ["h11"]
        values = {k: o[k] for k in names}
        values["chi"] = o["chi"]
        for k, v in values.items():
            groups[product][k].append(v)
        tuples[product].add((d,) + tuple(values[k] for k in names))
        h11_hist[product][values["h11"]] += 1
        if product:
            continue
        chi = o["chi"]
        if d == 4:
            h11, h21, h31, h22 = (values[k] for k in names)
            rel = {
                "chi = 48 + 6(h11 - h21 + h31)": chi == 48 + 6 * (h11 - h21 + h31),
                "h22 = 44 + 4 h11 - 2 h21 + 4 h31": h22 == 44 + 4 * h11 - 2 * h21 + 4 * h31,
            }
            if c2sq:
                c = c2sq.get(o["canonical"])
                rel["int c2^2 = 480 + chi/3"] = None if c is None else (3 * (c - 480) == chi)
        elif d == 3:
            rel = {"chi = 2(h11 - h21)": chi == 2 * (values["h11"] - values["h21"])}
        else:
            rel = {}
        for name, ok in rel.items():
            if ok is None:
                checks[(name, "missing")] += 1
            else:
                checks[(name, "ok" if ok else "failed")] += 1
                if not ok and len(failures) < 10:
                    failures.append((name, o["canonical"]))
    total = sum(status.values())
    print(f"results {total}: " + ", ".join(f"{k} {v}" for k, v in sorted(status.items())))
    print("dimensions: " + ", ".join(f"{k}: {v}" for k, v in sorted(dims.items())))
    for m, n in methods.most_common():
        print(f"method {m:<12} {n:>8}  compute {seconds[m]:.1f} s")
    for r, n in refusals.most_common():
        print(f"refused {n:>8}  {r}")
    for product in (False, True):
        g = groups[product]
        if not g:
            continue
        label = "products" if product else "non-products"
        n = len(g["h11"])
        print(f"{label}: {n} exact, {len(tuples[product])} distinct tuples; "
              + ", ".join(f"{k} {span(g[k])}" for k in ["h11", "h21", "h31", "h22", "chi"] if k in g)
              + f"; {len(set(g['chi']))} distinct chi")
        print(f"  h11 histogram ({label}): "
              + ", ".join(f"{h}: {c}" for h, c in sorted(h11_hist[product].items())))
    for (name, outcome), n in sorted(checks.items()):
        print(f"relation {name}: {outcome} {n}")
    for name, cfg in failures:
        print(f"  failed {name}: {cfg}")


if __name__ == "__main__":
    main()
