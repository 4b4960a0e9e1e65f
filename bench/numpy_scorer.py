#!/usr/bin/env python3
"""Reference scorer in numpy: what a researcher would write instead of winnow's scorer.

Reads a model exported by `winnow export-weights` (format winnow-weights v2, see bench/README.md)
and a bench candidate file (one `configuration<TAB>chi` a line), and for every candidate computes
the same features (the first-page h11 estimate included, per candidate in plain Python), the same
forward pass and the same distance-weighted vote of the k nearest reference embeddings (brute
force) as winnow's Predictor. Candidates are read in blocks and
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
    if w.get("format") != FORMAT or w.get("version") != 2:
        sys.exit(f"numpy_scorer: {path}: not a {FORMAT} v2 file")
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
        "tail_scale": float(w["vote"]["tail_scale"]),
        "tail_threshold": float(w["vote"]["tail_threshold"]),
        "anchored": bool(w["architecture"]["anchored"]),
        "anchor_scale": float(w["architecture"]["anchor_scale"]),
        "ref": arr(w["reference"]["embeddings"]),
    }
    h11 = np.asarray(w["reference"]["h11"], dtype=np.int64)
    estimate = np.zeros(len(h11), dtype=np.int64)
    if model["anchored"]:
        # The reference's anchors as winnow computed them (its tuple's h11: the Hodge engine's where a
        # first page is unsettled, and where the one maximal-rank assumption of the plain first page does
        # not hold). Where ours differs from a settled page, the exported anchor stands; say how often.
        estimate = np.asarray(w["reference"]["h11_estimate"], dtype=np.int64)
        differ = 0
        for i, text in enumerate(w["reference"]["configs"]):
            n, q, _ = parse(text + "\t0")
            mine, _terms, settled = h11_estimate(n, q)
            differ += settled and mine != estimate[i]
        if differ:
            print(f"numpy_scorer: {differ} reference anchors differ from the plain first page; the exported ones are used",
                  file=sys.stderr)
    # What each reference point votes for: its correction to the estimate (or h11 when unanchored).
    residual = h11 - estimate
    model["residuals"] = np.unique(residual)
    model["ref_class"] = np.searchsorted(model["residuals"], residual)
    # Equal weights go to the correction nearest zero, then the smaller one.
    pref = sorted(range(len(model["residuals"])), key=lambda c: (abs(model["residuals"][c]), model["residuals"][c]))
    model["preference"] = np.empty(len(pref), dtype=np.int64)
    model["preference"][pref] = np.arange(len(pref))
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


def h11_estimate(n, q):
    """First-page h11 estimate of a Calabi-Yau configuration, as winnow's H11Estimator (docs/model.md).

    m + eulerOne + max(0, conormalTwo - eulerTwo) with eulerOne/eulerTwo = sum_i (n_i+1) E1 h^1/h^2 of
    O_X(-J_i) and conormalTwo = sum_j E1 h^2 of O_X(-q_j); a depth-first search over column subsets S
    with the same cut as winnow's (rows holding both an included and an excluded column are stuck).
    Returns (estimate, terms, settled); settled as H11Estimator.settled (no later differential can
    reach the entries read, none where the derivation assumes zero). winnow asks its Hodge engine
    where a page is unsettled; this port does not, so such candidates are deferred (-1).
    """
    m, k = len(n), len(q[0])
    sums = [0] * m
    excl = [0] * m
    acc = [0, 0, 0]  # eulerOne, eulerTwo, conormalTwo
    pmin = {}  # (bundle, t) -> smallest Koszul column p of a nonzero entry; bundles: rows, then m + j
    pmax = {}

    def seen(b, t, p):
        pmin[b, t] = min(pmin.get((b, t), p), p)
        pmax[b, t] = max(pmax.get((b, t), p), p)

    def binom(top, bottom):
        r = 1
        for i in range(1, bottom + 1):
            r = r * (top - bottom + i) // i
        return r

    def full_product(skip):
        d = 1
        for r in range(m):
            if r != skip and sums[r] >= n[r] + 1:
                d *= binom(sums[r] - 1, n[r])
        return d

    def can_contribute(j, subset, gap_rows):
        rows = [r for r in range(m) if gap_rows >> r & 1]
        if len(rows) == 1 and excl[rows[0]] <= 1:
            return True
        for col in range(k):
            if col < j and not subset >> col & 1:
                continue
            if all(q[r][col] >= excl[r] for r in rows):
                return True
        return False

    def leaf(subset, size):
        gap = gap_deg = full_deg = 0
        for r in range(m):
            if sums[r] > n[r]:
                full_deg += n[r]
            elif sums[r] > 0:
                gap += 1
                gap_deg += n[r]
        if gap == 0:
            t = full_deg - size
            if 0 <= t <= 3:
                for i in range(m):
                    if sums[i] >= n[i] + 1:
                        seen(i, t, size)
                        if t in (1, 2):
                            acc[t - 1] += (n[i] + 1) * full_product(i) * binom(sums[i], n[i])
        elif gap == 1:
            t = full_deg + gap_deg - size
            if 0 <= t <= 3:
                for i in range(m):
                    if sums[i] == n[i]:
                        seen(i, t, size)
                        if t in (1, 2):
                            acc[t - 1] += (n[i] + 1) * full_product(i)
                        break
                    if 1 <= sums[i] < n[i]:
                        break
        if gap == 0 and size > 0:
            t = full_deg - size + 1
            if 1 <= t <= 3:
                for j in range(k):
                    if subset >> j & 1:
                        seen(m + j, t, size - 1)
                if t == 2:
                    acc[2] += size * full_product(-1)
        t = full_deg + gap_deg - size
        if size > 0 and 1 <= t <= 3:
            for j in range(k):
                if subset >> j & 1:
                    d = 1
                    for r in range(m):
                        a = sums[r] + q[r][j]
                        if a == 0:
                            continue
                        if a <= n[r]:
                            d = 0
                            break
                        d *= binom(a - 1, n[r])
                    if d:
                        seen(m + j, t, size)
                        if t == 2:
                            acc[2] += d

    def search(j, subset, size, gap_rows):
        if gap_rows and not can_contribute(j, subset, gap_rows):
            return
        if j == k:
            leaf(subset, size)
            return
        out_gap, in_gap = gap_rows, gap_rows
        for r in range(m):
            if q[r][j]:
                if sums[r] > 0:
                    out_gap |= 1 << r
                if excl[r] > 0:
                    in_gap |= 1 << r
        for r in range(m):
            excl[r] += q[r][j]
        search(j + 1, subset, size, out_gap)
        for r in range(m):
            excl[r] -= q[r][j]
            sums[r] += q[r][j]
        search(j + 1, subset | 1 << j, size + 1, in_gap)
        for r in range(m):
            sums[r] -= q[r][j]

    search(0, 0, 0, 0)
    settled = True
    for b in range(m + k):
        first = 0 if b < m else 1
        if (b, first) in pmax:
            settled = False
        for t in range(first, 3):
            if (b, t) in pmax and (b, t + 1) in pmin and pmin[b, t + 1] < pmax[b, t]:
                settled = False
    return m + acc[0] + max(0, acc[2] - acc[1]), acc, settled


def relu(x):
    return np.maximum(x, 0.0)


def dense(x, layer):
    w, b = layer
    return x @ w.T + b


def embed(model, n, q, chi, estimate, terms):
    """Embeddings of B candidates of one shape: n (B, m), q (B, m, K), chi (B,), estimates (B,), terms (B, 3)."""
    b, m, k = q.shape
    norm = model["norm"]
    nz = (q != 0)
    big = (q >= 2)
    xr = np.stack([n, q.sum(2), nz.sum(2), q.max(2), big.sum(2)], axis=2).astype(np.float64)
    xc = np.stack([q.sum(1), nz.sum(1), q.max(1), (q * n[:, :, None]).sum(1)], axis=2).astype(np.float64)
    sum_n = n.sum(1)
    g = np.stack([np.full(b, m), np.full(b, k), chi, nz.sum((1, 2)), big.sum((1, 2)), sum_n,
                  (n == 1).sum(1), sum_n - k, estimate, estimate - m, terms[:, 0],
                  np.maximum(0, terms[:, 2] - terms[:, 1])], axis=1).astype(np.float64)
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
    e = dense(u, model["read2"])
    if model["anchored"]:
        e = np.concatenate([e, model["anchor_scale"] * estimate[:, None].astype(np.float64)], axis=1)
    return e


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
    pref = model["preference"][cls]
    winner_pref = np.where(class_weight == best, pref, np.iinfo(np.int64).max).min(1)
    winner = np.argsort(model["preference"])[winner_pref]
    loo = model["loo"]
    if len(loo) == 0:
        novelty = np.ones(len(e))
    else:
        delta = dist[:, nk - 1]
        at_least = len(loo) - np.searchsorted(loo, delta, side="left")
        novelty = 1.0 - (1.0 + at_least) / (len(loo) + 1.0)
        u, scale = model["tail_threshold"], model["tail_scale"]
        if scale > 0:
            above = len(loo) - np.searchsorted(loo, u, side="right")
            tail = 1.0 - (1.0 + above) / (len(loo) + 1.0) * np.exp(-(delta - u) / scale)
            novelty = np.where(delta > u, tail, novelty)
    return model["residuals"][winner], novelty


# Wall-clock and CPU seconds spent in h11_estimate, so the report can say what share of numpy's time
# is the plain-Python estimate (winnow's share is measured by ForwardPassCost on the same file).
ESTIMATE_TIME = [0.0, 0.0]


def score_block(model, lines, search):
    """Predicted h11 of every line, in the lines' order; -1 where the first page is unsettled (deferred)."""
    groups = {}
    deferred = []
    for i, line in enumerate(lines):
        n, q, chi = parse(line)
        if model["anchored"]:
            t, c = time.perf_counter(), time.process_time()
            est, terms, settled = h11_estimate(n, q)
            ESTIMATE_TIME[0] += time.perf_counter() - t
            ESTIMATE_TIME[1] += time.process_time() - c
        else:
            est, terms, settled = 0, [0, 0, 0], True
        if not settled:
            deferred.append(i)
            continue
        groups.setdefault((len(n), len(q[0])), []).append((i, n, q, chi, est, terms))
    out = np.empty(len(lines), dtype=np.int64)
    out[deferred] = -1
    for members in groups.values():
        order = np.fromiter((t[0] for t in members), dtype=np.int64, count=len(members))
        n = np.array([t[1] for t in members], dtype=np.int64)
        q = np.array([t[2] for t in members], dtype=np.int64)
        chi = np.array([t[3] for t in members], dtype=np.int64)
        est = np.array([t[4] for t in members], dtype=np.int64)
        terms = np.array([t[5] for t in members], dtype=np.int64)
        correction, _novelty = vote(model, embed(model, n, q, chi, est, terms), search)
        out[order] = est + correction
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
          f"cpu_seconds={cpu:.3f} cpu_rate={total / cpu:.1f} "
          f"estimate_seconds={ESTIMATE_TIME[0]:.3f} estimate_cpu_seconds={ESTIMATE_TIME[1]:.3f}")
    print("histogram={" + ", ".join(f"{h}={counts[h]}" for h in sorted(counts)) + "}")


if __name__ == "__main__":
    main()
