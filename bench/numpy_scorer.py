#!/usr/bin/env python3
"""Reference scorer in numpy: what a researcher would write instead of winnow's scorer.

Reads a model exported by `winnow export-weights` (format winnow-weights v1, see bench/README.md)
and a bench candidate file (one `configuration<TAB>chi` a line), and for every candidate computes
the same features, the same forward pass and the same distance-weighted vote of the k nearest
reference embeddings (brute force) as winnow's Predictor. Candidates are read in blocks and
grouped by shape (rows m, columns K), so every layer is one numpy call per group.

Usage:
  numpy_scorer.py --weights W.json --candidates C.tsv              # prints rate and h11 histogram
  numpy_scorer.py --weights W.json --candidates C.tsv --predictions P.txt   # h11 per line, in order
  --search direct (default; the same sum of squared differences as winnow) or gemm (BLAS form)

The BLAS thread count is set by the caller (OPENBLAS_NUM_THREADS / OMP_NUM_THREADS) before start.
"""

import argparse
import json
import sys
import time

import numpy as np

BLOCK = 8192       # candidates read and scored together
SEARCH_CHUNK = 256  # queries per brute-force distance block (memory: chunk x reference x dim)
FORMAT = "winnow-weights"


def load_model(path):
    with open(path, encoding="utf-8") as f:
        w = json.load(f)
    if w.get("format") != FORMAT or w.get("version") != 1:
        sys.exit(f"numpy_scorer: {path}: not a {FORMAT} v1 file")
    arr = lambda x: np.asarray(x, dtype=np.float64)
    layers = w["layers"]
    model = {
        "norm": {k: arr(v) for k, v in w["normalisation"].items()},
        "row_enc": (arr(layers["row_encoder"]["weight"]), arr(layers["row_encoder"]["bias"])),
        "col_enc": (arr(layers["col_encoder"]["weight"]), arr(layers["col_encoder"]["bias"])),
        "rounds": [{k: arr(v) for k, v in r.items()} for r in layers["rounds"]],
        "read1": (arr(layers["readout_hidden"]["weight"]), arr(layers["readout_hidden"]["bias"])),
        "read2": (arr(layers["readout_out"]["weight"]), arr(layers["readout_out"]["bias"])),
        "k": int(w["vote"]["k"]),
        "bandwidth": float(w["vote"].get("bandwidth", 0.0)),
        "novelty_k": int(w["vote"]["novelty_k"]),
        "floor": float(w["vote"]["distance_floor"]),
        "classes": np.asarray(w["vote"]["classes"], dtype=np.int64),
        "loo": arr(w["vote"]["loo_distances"]),
        "ref": arr(w["reference"]["embeddings"]),
    }
    h11 = np.asarray(w["reference"]["h11"], dtype=np.int64)
    model["ref_class"] = np.searchsorted(model["classes"], h11)
    model["ref_sq"] = (model["ref"] * model["ref"]).sum(1)
    return model


def parse(line):
    """'n:d,d/n:d,d<TAB>chi' -> (n list, q rows, chi)."""
    text, chi = line.split("\t")
    ns, qs = [], []
    for row in text.split("/"):
        n, degrees = row.split(":")
        ns.append(int(n))
        qs.append([int(d) for d in degrees.split(",")])
    return ns, qs, int(chi)


def relu(x):
    return np.maximum(x, 0.0)


def dense(x, layer):
    w, b = layer
    return x @ w.T + b


def embed(model, n, q, chi):
    """Embeddings of B candidates of one shape: n (B, m), q (B, m, K), chi (B,)."""
    b, m, k = q.shape
    norm = model["norm"]
    nz = (q != 0)
    big = (q >= 2)
    xr = np.stack([n, q.sum(2), nz.sum(2), q.max(2), big.sum(2)], axis=2).astype(np.float64)
    xc = np.stack([q.sum(1), nz.sum(1), q.max(1), (q * n[:, :, None]).sum(1)], axis=2).astype(np.float64)
    sum_n = n.sum(1)
    g = np.stack([np.full(b, m), np.full(b, k), chi, nz.sum((1, 2)), big.sum((1, 2)), sum_n,
                  (n == 1).sum(1), sum_n - k], axis=1).astype(np.float64)
    xr = (xr - norm["row_mean"]) * norm["row_scale"]
    xc = (xc - norm["col_mean"]) * norm["col_scale"]
    g = (g - norm["global_mean"]) * norm["global_scale"]

    qf = q.astype(np.float64)
    qt = qf.transpose(0, 2, 1)
    hr = relu(dense(xr, model["row_enc"]))
    hc = relu(dense(xc, model["col_enc"]))
    for r in model["rounds"]:
        ac = qt @ hr
        hc = relu(hc @ r["col_self"].T + ac @ r["col_msg"].T + r["col_bias"])
        ar = qf @ hc
        hr = relu(hr @ r["row_self"].T + ar @ r["row_msg"].T + r["row_bias"])
    z = np.concatenate([hr.sum(1), hr.max(1), hc.sum(1), hc.max(1), g], axis=1)
    u = relu(dense(z, model["read1"]))
    return dense(u, model["read2"])


def squared_distances(model, q, search):
    """Squared distances from queries q (b, dim) to every reference point (b, size)."""
    ref = model["ref"]
    if search == "gemm":
        # |q|^2 - 2 q.r + |r|^2: one matrix product, the way a BLAS user writes it; cancellation
        # makes it inexact for near neighbours, hence the clip.
        d2 = (q * q).sum(1)[:, None] - 2.0 * (q @ ref.T) + model["ref_sq"][None, :]
        return np.maximum(d2, 0.0)
    return ((q[:, None, :] - ref[None, :, :]) ** 2).sum(2)


def nearest(model, e, k, search):
    """Indices and distances of the k nearest reference points, nearest first, ties to the lower index."""
    idx = np.empty((len(e), k), dtype=np.int64)
    dist = np.empty((len(e), k))
    for s in range(0, len(e), SEARCH_CHUNK):
        d2 = squared_distances(model, e[s:s + SEARCH_CHUNK], search)
        part = np.argpartition(d2, k - 1, axis=1)[:, :k]
        pd = np.take_along_axis(d2, part, 1)
        order = np.lexsort((part, pd), axis=1)
        part = np.take_along_axis(part, order, 1)
        pd = np.take_along_axis(pd, order, 1)
        # A tie at the k-th distance: the lowest indices win, as in a sequential scan.
        kth = pd[:, -1]
        tied = np.nonzero((d2 <= kth[:, None]).sum(1) > k)[0]
        for t in tied:
            best = np.argsort(d2[t], kind="stable")[:k]
            part[t], pd[t] = best, d2[t, best]
        idx[s:s + SEARCH_CHUNK] = part
        dist[s:s + SEARCH_CHUNK] = pd
    return idx, np.sqrt(dist)


def vote(model, e, search):
    """Predicted h11 and novelty of embeddings e (B, dim)."""
    k = model["k"]
    nk = model["novelty_k"]
    idx, dist = nearest(model, e, max(k, nk), search)
    cls = model["ref_class"][idx[:, :k]]
    d = dist[:, :k]
    bw = model["bandwidth"]
    if bw > 0:  # Gaussian kernel relative to the nearest neighbour, as winnow's Predictor
        w = np.exp(-(d * d - d[:, :1] * d[:, :1]) * (0.5 / (bw * bw)))
    else:
        w = 1.0 / (d + model["floor"])
    same = cls[:, :, None] == cls[:, None, :]
    class_weight = (w[:, None, :] * same).sum(2)          # weight of each neighbour's class
    best = class_weight.max(1, keepdims=True)
    winner = np.where(class_weight == best, cls, np.iinfo(np.int64).max).min(1)
    loo = model["loo"]
    if len(loo) == 0:
        novelty = np.ones(len(e))
    else:
        at_least = len(loo) - np.searchsorted(loo, dist[:, nk - 1], side="left")
        novelty = 1.0 - (1.0 + at_least) / (len(loo) + 1.0)
    return model["classes"][winner], novelty


def score_block(model, lines, search):
    """Predicted h11 of every line, in the lines' order."""
    groups = {}
    for i, line in enumerate(lines):
        n, q, chi = parse(line)
        groups.setdefault((len(n), len(q[0])), []).append((i, n, q, chi))
    out = np.empty(len(lines), dtype=np.int64)
    for members in groups.values():
        order = np.fromiter((t[0] for t in members), dtype=np.int64, count=len(members))
        n = np.array([t[1] for t in members], dtype=np.int64)
        q = np.array([t[2] for t in members], dtype=np.int64)
        chi = np.array([t[3] for t in members], dtype=np.int64)
        h11, _novelty = vote(model, embed(model, n, q, chi), search)
        out[order] = h11
    return out


def blocks(path):
    with open(path, encoding="utf-8") as f:
        block = []
        for line in f:
            line = line.rstrip("\n")
            if line:
                block.append(line)
                if len(block) == BLOCK:
                    yield block
                    block = []
        if block:
            yield block


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--weights", required=True)
    ap.add_argument("--candidates", required=True)
    ap.add_argument("--predictions")
    ap.add_argument("--search", choices=["direct", "gemm"], default="direct",
                    help="direct: sum of squared differences, as winnow; gemm: |q|^2 - 2 q.r + |r|^2 via BLAS")
    args = ap.parse_args()
    model = load_model(args.weights)
    if args.predictions:
        with open(args.predictions, "w", encoding="utf-8") as out:
            for block in blocks(args.candidates):
                out.write("".join(f"{h}\n" for h in score_block(model, block, args.search)))
        return
    start = time.perf_counter()
    cpu = time.process_time()
    counts = {}
    total = 0
    for block in blocks(args.candidates):
        values, freq = np.unique(score_block(model, block, args.search), return_counts=True)
        for v, c in zip(values.tolist(), freq.tolist()):
            counts[v] = counts.get(v, 0) + c
        total += len(block)
    seconds = time.perf_counter() - start
    cpu = time.process_time() - cpu
    print(f"candidates={total} seconds={seconds:.3f} rate={total / seconds:.1f} "
          f"cpu_seconds={cpu:.3f} cpu_rate={total / cpu:.1f}")
    print("histogram={" + ", ".join(f"{h}={counts[h]}" for h in sorted(counts)) + "}")


if __name__ == "__main__":
    main()
