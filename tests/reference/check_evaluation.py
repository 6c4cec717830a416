# SPDX-License-Identifier: MIT
"""Checks `slatewise evaluate` against scikit-learn and numpy on random data.

Random data with a fixed seed is written as CSV, imported with `slatewise import` and
`add-run`, evaluated with `slatewise evaluate --json --per-user`, and every aggregate and
every per-user value is compared at 1e-9 with:
  - sklearn.metrics.mean_squared_error / mean_absolute_error (accuracy),
  - sklearn.metrics.ndcg_score per user with k given (binary and graded NDCG; linear gain,
    the ideal list built from the user's relevant withheld items, no tied scores),
  - numpy computations of the other formulas of the evaluation issue.
Scores and ratings are stored as 32-bit floats in a workspace, so the reference rounds them
the same way before computing.

Run with Debian's /usr/bin/python3 (numpy, scipy, scikit-learn from python3-* packages):
  check_evaluation.py --cli PATH_TO_slatewise --workdir DIR
"""
import argparse
import csv
import json
import math
import os
import shutil
import subprocess
import sys

import numpy as np
from sklearn.metrics import mean_absolute_error, mean_squared_error, ndcg_score

TOL = 1e-9
K = 10
MAX_K = 50
RELEVANT_AT = 4.0
failures = []


def check(name, actual, expected, tol=TOL):
    if actual is None or expected is None or (isinstance(expected, float) and math.isnan(expected)):
        same = (actual is None) == (expected is None or (isinstance(expected, float) and math.isnan(expected)))
    else:
        same = abs(actual - expected) <= tol
    if not same:
        failures.append(f"{name}: slatewise {actual!r}, reference {expected!r}")


def f32(x):
    return float(np.float32(x))


def make_data(rng):
    n_users, n_items = 80, 300
    items = [f"it{j:03d}" for j in range(n_items)]
    genres = ["Drama", "Comedy", "Mystery", "Western", "Musical", "Noir"]
    catalog = []
    for j, item in enumerate(items):
        g = rng.choice(genres, size=rng.integers(1, 3), replace=False)
        catalog.append((item, f"Picture {j}", int(1950 + rng.integers(0, 70)), ";".join(sorted(g))))
    users = [f"member{u:02d}" for u in range(n_users)]
    train, withheld, scores, lists = [], [], [], []
    truth = {}
    for u, user in enumerate(users):
        order = rng.permutation(n_items)
        n_train = int(rng.integers(3, 25))
        n_withheld = int(rng.integers(1, 30)) if u != 0 else 1
        for t, j in enumerate(order[:n_train]):
            train.append((user, items[j], int(rng.integers(1, 6)), 1700000000 + 1000 * u + t))
        w_items = order[n_train:n_train + n_withheld]
        ratings = rng.integers(1, 6, size=n_withheld).astype(float)
        if u % 9 == 0:
            ratings = np.minimum(ratings, 3.0)  # users with no relevant withheld item
        # Distinct scores per user (held-out top-k ties would depend on item numbering).
        while True:
            s = np.round(ratings + rng.normal(0.0, 0.9, size=n_withheld), 3)
            if len({f32(x) for x in s}) == n_withheld:
                break
        has_score = rng.random(n_withheld) > 0.08
        per_user = []
        for j, r, sc, hs in zip(w_items, ratings, s, has_score):
            withheld.append((user, items[j], int(r), 1800000000 + u))
            if hs:
                scores.append((user, items[j], f"{sc:.3f}"))
            per_user.append((items[j], float(r), f32(sc) if hs else None))
        # Lists of 60 items: withheld items placed by a noisy score, mixed with others.
        has_list = u % 13 != 5
        ranked = []
        if has_list:
            candidates = list(w_items) + list(order[n_train + n_withheld:n_train + n_withheld + 60])
            noise = rng.normal(0.0, 1.5, size=len(candidates))
            bonus = np.array([ratings[i] if i < n_withheld else 2.5 for i in range(len(candidates))])
            pick = np.argsort(-(bonus + noise), kind="stable")[:60]
            ranked = [items[candidates[i]] for i in pick]
            for rank, item in enumerate(ranked, start=1):
                lists.append((user, rank, item))
        truth[user] = {"withheld": per_user, "list": ranked, "train": n_train}
    return catalog, train, withheld, scores, lists, truth


def write_csv(path, header, rows):
    with open(path, "w", newline="", encoding="utf-8") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(header)
        w.writerows(rows)


def run(cli, *args):
    p = subprocess.run([cli, *args], capture_output=True, text=True)
    if p.returncode != 0:
        print(f"command failed ({p.returncode}): {' '.join([cli, *args])}\n{p.stdout}\n{p.stderr}", file=sys.stderr)
        sys.exit(1)
    return p


def user_ranking(t, k):
    rel = {i: r for i, r, _ in t["withheld"] if r >= RELEVANT_AT}
    if not rel:
        return None
    top = t["list"][:k]
    hits = [1.0 if i in rel else 0.0 for i in top]
    n_hits = sum(hits)
    ideal = min(k, len(rel))
    ap = sum(sum(hits[:j + 1]) / (j + 1) for j in range(len(top)) if hits[j]) / ideal
    first = next((j + 1 for j in range(len(top)) if hits[j]), None)
    out = {"precision": n_hits / k, "recall": n_hits / len(rel), "ap": ap, "rr": 1.0 / first if first else 0.0,
           "hit": 1.0 if n_hits else 0.0}
    if not t["list"]:
        out["ndcg"] = out["ndcg_graded"] = 0.0
        return out
    # sklearn ndcg_score: list items scored by rank (no ties), relevant items missing from the
    # list appended below them so that the ideal ranking sees every relevant item.
    listed = t["list"]
    missing = [i for i in rel if i not in listed]
    docs = listed + missing
    y_score = np.array([[len(docs) - p for p in range(len(docs))]], dtype=float)
    y_bin = np.array([[1.0 if i in rel else 0.0 for i in docs]])
    y_grade = np.array([[rel.get(i, 0.0) for i in docs]])
    out["ndcg"] = float(ndcg_score(y_bin, y_score, k=k))
    out["ndcg_graded"] = float(ndcg_score(y_grade, y_score, k=k))
    return out


def heldout(t, k):
    s = [(sc, i, r) for i, r, sc in t["withheld"] if sc is not None]
    if not s:
        return None
    kk = min(k, len(s))
    chosen = sorted(s, key=lambda x: -x[0])[:kk]
    threshold = sorted((r for _, _, r in s), reverse=True)[kk - 1]
    return sum(1 for _, _, r in chosen if r >= threshold) / kk


def dcg_curve(t, rel, kmax):
    out = {"precision": [], "recall": [], "ndcg": []}
    hits = [1.0 if i in rel else 0.0 for i in t["list"][:kmax]]
    hits += [0.0] * (kmax - len(hits))
    disc = 1.0 / np.log2(np.arange(2, kmax + 2))
    for k in range(1, kmax + 1):
        h = sum(hits[:k])
        out["precision"].append(h / k)
        out["recall"].append(h / len(rel))
        out["ndcg"].append(float(np.dot(hits[:k], disc[:k]) / disc[:min(k, len(rel))].sum()))
    return out


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--cli", required=True)
    ap.add_argument("--workdir", required=True)
    a = ap.parse_args()
    shutil.rmtree(a.workdir, ignore_errors=True)
    os.makedirs(a.workdir)
    d = lambda name: os.path.join(a.workdir, name)

    rng = np.random.default_rng(20261202)
    catalog, train, withheld, scores, lists, truth = make_data(rng)
    write_csv(d("catalog.csv"), ["item_id", "title", "year", "genres"], catalog)
    write_csv(d("train.csv"), ["user_id", "item_id", "rating", "timestamp"], train)
    write_csv(d("withheld.csv"), ["user_id", "item_id", "rating", "timestamp"], withheld)
    write_csv(d("scores.csv"), ["user_id", "item_id", "score"], scores)
    write_csv(d("lists.csv"), ["user_id", "rank", "item_id"], lists)
    ws = d("check.sqlite")
    run(a.cli, "import", ws, "--catalog", d("catalog.csv"), "--train", d("train.csv"), "--test", d("withheld.csv"),
        "--quiet")
    run(a.cli, "add-run", ws, "--name", "both", "--scores", d("scores.csv"), "--lists", d("lists.csv"), "--quiet")
    run(a.cli, "add-run", ws, "--name", "scores-only", "--scores", d("scores.csv"), "--quiet")
    run(a.cli, "add-run", ws, "--name", "lists-only", "--lists", d("lists.csv"), "--quiet")
    run(a.cli, "evaluate", ws, "--json", d("eval.json"), "--per-user", d("users.csv"), "--bootstrap", "300",
        "--quiet")
    doc = json.load(open(d("eval.json"), encoding="utf-8"))

    # --- the document's shape
    check("settings.k", doc["settings"]["k"], K)
    check("settings.relevant_at", doc["settings"]["relevant_at"], RELEVANT_AT)
    check("settings.bootstrap", doc["settings"]["bootstrap"], 300)
    runs = {r["name"]: r for r in doc["runs"]}
    if sorted(runs) != ["both", "lists-only", "scores-only"]:
        failures.append(f"runs in JSON: {sorted(runs)}")
    for key in ("name", "accuracy", "ranking", "ci", "beyond", "warnings"):
        if key not in runs["both"]:
            failures.append(f"run object lacks '{key}'")
    if runs["scores-only"]["ranking"] is not None or runs["scores-only"]["beyond"] is not None:
        failures.append("a run without lists must have ranking and beyond null")
    if runs["lists-only"]["accuracy"] is not None:
        failures.append("a run without scores must have accuracy null")
    beyond_keys = ["ild", "novelty", "coverage", "gini", "popularity_lift", "calibration_kl", "series_share",
                   "order_violations", "order_violations_users", "burst_echo", "seen_in_list", "seen_in_list_users"]
    for key in beyond_keys:
        if key not in (runs["both"]["beyond"] or {}):
            failures.append(f"beyond lacks '{key}'")

    # --- accuracy: sklearn on every scored withheld pair
    y, yhat, per_user_rmse, bands = [], [], [], {}
    n_withheld = 0
    for user, t in truth.items():
        e = [(sc, r) for _, r, sc in t["withheld"] if sc is not None]
        n_withheld += len(t["withheld"])
        for sc, r in e:
            y.append(r)
            yhat.append(sc)
            bands.setdefault(r, []).append((sc, r))
        if e:
            per_user_rmse.append(mean_squared_error([r for _, r in e], [s for s, _ in e], squared=False))
    acc = runs["both"]["accuracy"]
    check("accuracy.n", acc["n"], len(y))
    check("accuracy.missing_scores", acc["missing_scores"], n_withheld - len(y))
    check("accuracy.scored_fraction", acc["scored_fraction"], len(y) / n_withheld)
    check("accuracy.rmse", acc["rmse"], mean_squared_error(y, yhat, squared=False))
    check("accuracy.mae", acc["mae"], mean_absolute_error(y, yhat))
    check("accuracy.mean_error", acc["mean_error"], float(np.mean(np.array(yhat) - np.array(y))))
    check("accuracy.user_rmse_mean", acc["user_rmse_mean"], float(np.mean(per_user_rmse)))
    if [b["rating"] for b in acc["bands"]] != sorted(bands):
        failures.append(f"bands: {[b['rating'] for b in acc['bands']]} vs {sorted(bands)}")
    for b in acc["bands"]:
        pairs = bands.get(b["rating"], [])
        check(f"band {b['rating']} n", b["n"], len(pairs))
        check(f"band {b['rating']} rmse", b["rmse"], mean_squared_error([r for _, r in pairs], [s for s, _ in pairs],
                                                                          squared=False))
        check(f"band {b['rating']} mae", b["mae"], mean_absolute_error([r for _, r in pairs], [s for s, _ in pairs]))
        check(f"band {b['rating']} mean_error", b["mean_error"], float(np.mean([s - r for s, r in pairs])))
    for name in ("both", "scores-only"):
        if runs[name]["accuracy"]["rmse"] != acc["rmse"]:
            failures.append(f"run {name}: rmse differs between runs with the same scores")

    # --- ranking: sklearn ndcg_score per user, numpy for the rest
    per_user = {user: user_ranking(t, K) for user, t in truth.items()}
    ranked = {u: r for u, r in per_user.items() if r is not None}
    rk = runs["both"]["ranking"]
    check("ranking.users", rk["users"], len(ranked))
    check("ranking.users_without_list", rk["users_without_list"], sum(1 for u in ranked if not truth[u]["list"]))
    for key, ref in (("precision", "precision"), ("recall", "recall"), ("hit_rate", "hit"), ("mrr", "rr"),
                     ("map", "ap"), ("ndcg", "ndcg"), ("ndcg_graded", "ndcg_graded")):
        check(f"ranking.{key}", rk[key], float(np.mean([r[ref] for r in ranked.values()])))
    hv = [heldout(t, K) for t in truth.values()]
    check("ranking.heldout_topk", rk["heldout_topk"], float(np.mean([h for h in hv if h is not None])))
    check("accuracy.heldout_topk", acc.get("heldout_topk"), float(np.mean([h for h in hv if h is not None])))
    curves = [dcg_curve(truth[u], {i for i, r, _ in truth[u]["withheld"] if r >= RELEVANT_AT}, MAX_K) for u in ranked]
    if rk["curves"]["k"] != list(range(1, MAX_K + 1)):
        failures.append("curves.k is not 1..50")
    for key in ("precision", "recall", "ndcg"):
        ref = np.mean([c[key] for c in curves], axis=0)
        for k in range(MAX_K):
            check(f"curves.{key}[k={k + 1}]", rk["curves"][key][k], float(ref[k]))
    check("curve ndcg at k=10 equals ndcg", rk["curves"]["ndcg"][K - 1], rk["ndcg"])
    if runs["lists-only"]["ranking"]["ndcg"] != rk["ndcg"]:
        failures.append("lists-only run: ndcg differs from the run with the same lists")
    if not math.isnan(runs["lists-only"]["ranking"]["heldout_topk"] or float("nan")):
        failures.append("lists-only run: heldout_topk must be null")

    # --- intervals: present, ordered, and around the estimate for these well-behaved metrics
    for key in ("rmse", "mae", "mean_error", "precision", "recall", "hit_rate", "mrr", "map", "ndcg", "ndcg_graded",
                "heldout_topk", "user_rmse_mean"):
        lo, hi = runs["both"]["ci"].get(key, [None, None])
        point = acc.get(key) if key in acc else rk.get(key)
        if key == "user_rmse_mean":
            point = acc["user_rmse_mean"]
        if lo is None or hi is None or not (lo <= point <= hi):
            failures.append(f"ci.{key} = [{lo}, {hi}] does not hold the estimate {point}")

    # --- per-user CSV against the same references
    header_expected = ("run,user_id,n_withheld,n_relevant,rmse,mae,mean_error,precision,recall,ap,rr,ndcg,"
                       "ndcg_graded,heldout_topk,ild,novelty,popularity_lift,calibration_kl,series_share,"
                       "order_violations,burst_echo,seen_in_list")
    with open(d("users.csv"), encoding="utf-8") as f:
        header = f.readline().strip()
        if header != header_expected:
            failures.append(f"per-user CSV header: {header}")
        f.seek(0)
        rows = [r for r in csv.DictReader(f) if r["run"] == "both"]
    if len(rows) != len(truth):
        failures.append(f"per-user CSV has {len(rows)} rows for run 'both', expected {len(truth)}")
    num = lambda s: None if s == "" else float(s)
    for row in rows:
        t = truth[row["user_id"]]
        e = [(sc, r) for _, r, sc in t["withheld"] if sc is not None]
        check(f"{row['user_id']} n_withheld", num(row["n_withheld"]), len(t["withheld"]))
        check(f"{row['user_id']} rmse", num(row["rmse"]),
              mean_squared_error([r for _, r in e], [s for s, _ in e], squared=False) if e else None)
        check(f"{row['user_id']} mae", num(row["mae"]),
              mean_absolute_error([r for _, r in e], [s for s, _ in e]) if e else None)
        ref = per_user[row["user_id"]]
        for key in ("precision", "recall", "ap", "rr", "ndcg", "ndcg_graded"):
            check(f"{row['user_id']} {key}", num(row[key]), ref[key] if ref else None)
        check(f"{row['user_id']} heldout_topk", num(row["heldout_topk"]), heldout(t, K))

    # --- stored results are reused, recomputation reproduces them (fixed bootstrap seed)
    run(a.cli, "evaluate", ws, "--json", d("again.json"), "--bootstrap", "300", "--quiet")
    run(a.cli, "evaluate", ws, "--json", d("recomputed.json"), "--bootstrap", "300", "--recompute", "--quiet")
    again = json.load(open(d("again.json"), encoding="utf-8"))
    recomputed = json.load(open(d("recomputed.json"), encoding="utf-8"))
    if again != doc:
        failures.append("evaluating again did not return the stored results unchanged")
    strip = lambda x: [{k: v for k, v in r.items() if k != "computed_at"} for r in x["runs"]]
    if strip(recomputed) != strip(doc):
        failures.append("recomputing with the same seed changed the results")

    if failures:
        print(f"{len(failures)} mismatches:")
        for f in failures[:60]:
            print("  " + f)
        sys.exit(1)
    print(f"ok: {len(truth)} users, {len(y)} scored pairs, {len(ranked)} ranked users, all within {TOL}")


if __name__ == "__main__":
    main()
