# SPDX-License-Identifier: MIT
"""Reference models and re-rankers checked against numpy (Debian's python3-numpy).

Runs the command line on a small seeded workspace, then recomputes from the dumped
parameters (`fit --dump-model`) and the workspace's tables:
- bias baseline = closed-form solution of the regularized least-squares problem of
  Koren, KDD 2008, section 2.1 (normal equations solved with numpy.linalg.solve);
- every ALS user row = numpy.linalg.solve of its weighted-λ normal equations
  (Zhou, Wilkinson, Schreiber & Pan 2008), given the fitted item side;
- item-item similarities = shrunk residual Pearson correlation (Koren 2008 section 3);
- fit_log's last withheld RMSE = RMSE of the stored scores;
- mmr with λ = 1 returns the parent's lists (Carbonell & Goldstein 1998), smaller λ raises
  ild@10 (Jaccard intra-list diversity, Ziegler et al. 2005); series-order leaves no order
  violations; no list holds a train item.
Usage: /usr/bin/python3 check_models.py --cli PATH --workdir DIR
"""
import argparse
import json
import os
import shutil
import sqlite3
import subprocess
import sys

import numpy as np

FAILURES = []


def check(cond, what):
    print(("ok   " if cond else "FAIL ") + what)
    if not cond:
        FAILURES.append(what)


def run(cli, *args):
    proc = subprocess.run([cli, *args], capture_output=True, text=True)
    if proc.returncode != 0:
        print(proc.stdout)
        print(proc.stderr, file=sys.stderr)
        raise SystemExit(f"slatewise {' '.join(args)} failed with exit code {proc.returncode}")
    return proc.stdout


def make_data(workdir):
    rng = np.random.default_rng(20261202)
    n_users, n_items, rank = 80, 60, 2
    genres = ["drama", "comedy", "thriller", "musical", "western"]
    catalog = ["item_id,title,year,genres,series,series_part"]
    for i in range(n_items):
        g = ";".join(sorted(set(rng.choice(genres, size=rng.integers(1, 3), replace=False))))
        series, part = "", ""
        if i < 30:  # ten series of three parts
            series, part = f"Saga {i // 3}", str(i % 3 + 1)
        catalog.append(f"m{i},Picture {i},{2000 + i % 20},{g},{series},{part}")
    p = rng.normal(0, 0.7, (n_users, rank))
    q = rng.normal(0, 0.7, (n_items, rank))
    bu = rng.normal(0, 0.4, n_users)
    bi = rng.normal(0, 0.5, n_items)
    train = ["user_id,item_id,rating,timestamp"]
    test = ["user_id,item_id,rating,timestamp"]
    for u in range(n_users):
        items = rng.choice(n_items, size=24, replace=False)
        for k, i in enumerate(items):
            r = 3.4 + bu[u] + bi[i] + p[u] @ q[i] + rng.normal(0, 0.5)
            r = int(min(5, max(1, round(r))))
            line = f"c{u},m{i},{r},{1700000000 + 86400 * (u + k)}"
            (train if k < 20 else test).append(line)
    for name, lines in (("catalog.csv", catalog), ("train.csv", train), ("withheld.csv", test)):
        with open(os.path.join(workdir, name), "w", encoding="utf-8") as f:
            f.write("\n".join(lines) + "\n")


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--cli", required=True)
    ap.add_argument("--workdir", required=True)
    a = ap.parse_args()
    shutil.rmtree(a.workdir, ignore_errors=True)
    os.makedirs(a.workdir)
    make_data(a.workdir)
    ws = os.path.join(a.workdir, "models.sqlite")
    d = lambda n: os.path.join(a.workdir, n)
    run(a.cli, "import", ws, "--catalog", d("catalog.csv"), "--train", d("train.csv"), "--test", d("withheld.csv"),
        "--quiet")

    db = sqlite3.connect(ws)
    uid = {ext: i for i, ext in db.execute("SELECT user_id, external_id FROM users")}
    iid = {ext: i for i, ext in db.execute("SELECT item_id, external_id FROM items")}
    train = [(u, i, r) for u, i, r in db.execute("SELECT user_id, item_id, rating FROM train")]
    withheld = {(u, i): r for u, i, r in db.execute("SELECT user_id, item_id, rating FROM withheld")}
    mu = np.mean([r for _, _, r in train])

    # --- bias baseline: closed form of Koren 2008 section 2.1 (λ_u = 10, λ_i = 25 defaults)
    run(a.cli, "fit", ws, "--model", "bias", "--name", "bias", "--iterations", "1000", "--dump-model", d("bias.json"),
        "--quiet", "--no-evaluate")
    bias = json.load(open(d("bias.json")))
    users = {ext: k for k, ext in enumerate(bias["user_ids"])}
    items = {ext: k for k, ext in enumerate(bias["item_ids"])}
    nu, ni = len(users), len(items)
    A = np.zeros((len(train), nu + ni))
    y = np.zeros(len(train))
    ext_user = {v: k for k, v in uid.items()}
    ext_item = {v: k for k, v in iid.items()}
    for row, (u, i, r) in enumerate(train):
        A[row, users[ext_user[u]]] = 1
        A[row, nu + items[ext_item[i]]] = 1
        y[row] = r - mu
    reg = np.concatenate([np.full(nu, 10.0), np.full(ni, 25.0)])
    b = np.linalg.solve(A.T @ A + np.diag(reg), A.T @ y)
    got = np.concatenate([bias["user_bias"], bias["item_bias"]])
    check(abs(bias["global_mean"] - mu) < 1e-9, "bias: global mean = numpy mean of train ratings")
    check(np.max(np.abs(got - b)) < 1e-5,
          f"bias: biases = closed-form regularized solution (max diff {np.max(np.abs(got - b)):.2e})")

    # --- ALS user step = numpy.linalg.solve of the weighted-λ normal equations
    lam = 0.1
    run(a.cli, "fit", ws, "--model", "als", "--name", "als", "--rank", "3", "--lambda", str(lam), "--iterations", "5",
        "--no-clip", "--dump-model", d("als.json"), "--quiet", "--no-evaluate")
    als = json.load(open(d("als.json")))
    Q = np.array(als["item_factors"])
    qb = np.array(als["item_bias"])
    P = np.array(als["user_factors"])
    pb = np.array(als["user_bias"])
    by_user = {}
    for u, i, r in train:
        by_user.setdefault(users[ext_user[u]], []).append((items[ext_item[i]], r))
    worst = 0.0
    for u, rows in by_user.items():
        idx = np.array([i for i, _ in rows])
        r = np.array([r for _, r in rows])
        Y = np.hstack([Q[idx], np.ones((len(idx), 1))])
        x = np.linalg.solve(Y.T @ Y + lam * len(idx) * np.eye(4), Y.T @ (r - als["global_mean"] - qb[idx]))
        worst = max(worst, np.max(np.abs(x - np.append(P[u], pb[u]))))
    check(worst < 1e-8, f"als: every user row = numpy.linalg.solve of its normal equations (max diff {worst:.2e})")

    als_id = db.execute("SELECT run_id FROM runs WHERE name='als'").fetchone()[0]
    log = db.execute("SELECT iteration, train_rmse, withheld_rmse FROM fit_log WHERE run_id=? ORDER BY iteration",
                     (als_id,)).fetchall()
    check([row[0] for row in log] == [1, 2, 3, 4, 5], "als: fit_log holds one row per iteration")
    scores = db.execute("SELECT user_id, item_id, score FROM run_scores WHERE run_id=?", (als_id,)).fetchall()
    rmse = np.sqrt(np.mean([(s - withheld[(u, i)]) ** 2 for u, i, s in scores]))
    check(len(scores) == len(withheld), "als: a score for every withheld pair")
    check(abs(rmse - log[-1][2]) < 1e-5, f"als: last logged withheld RMSE {log[-1][2]:.6f} = numpy RMSE {rmse:.6f}")

    # --- item-item similarities: shrunk residual Pearson (Koren 2008 section 3), shrinkage 100
    run(a.cli, "fit", ws, "--model", "itemknn", "--name", "knn", "--neighbours", "5", "--dump-model", d("knn.json"),
        "--quiet", "--no-evaluate")
    knn = json.load(open(d("knn.json")))
    E = np.full((nu, ni), np.nan)
    for u, i, r in train:
        uu, ii = users[ext_user[u]], items[ext_item[i]]
        E[uu, ii] = r - (knn["global_mean"] + knn["user_bias"][uu] + knn["item_bias"][ii])
    M = ~np.isnan(E)
    Z = np.where(M, E, 0.0)
    num = Z.T @ Z
    sq = (Z ** 2).T @ M.astype(float)  # sq[i, j] = Σ over users with both of e_ui²
    n = M.T.astype(float) @ M.astype(float)
    with np.errstate(divide="ignore", invalid="ignore"):
        rho = num / np.sqrt(sq * sq.T)
    S = n / (n + 100.0) * rho
    worst, missing = 0.0, 0
    for i, row in enumerate(knn["similarities"]):
        got_j = {j for j, _, _ in row}
        for j, s, support in row:
            worst = max(worst, abs(s - S[i, j]))
            if support != n[i, j]:
                missing += 1
        expected = {j for j in range(ni) if j != i and n[i, j] > 0 and S[i, j] > 0}
        missing += len(expected ^ got_j)
    check(worst < 1e-5, f"itemknn: similarities = numpy computation (max diff {worst:.2e})")
    check(missing == 0, "itemknn: each pool holds exactly the positive similarities with their support")

    # --- lists never hold a train item
    seen = {(u, i) for u, i, _ in train}
    for name in ("popular", "mean"):
        run(a.cli, "fit", ws, "--model", name, "--name", name, "--list-length", "20", "--quiet", "--no-evaluate")
    bad = 0
    for name in ("bias", "als", "knn", "popular", "mean"):
        rid = db.execute("SELECT run_id FROM runs WHERE name=?", (name,)).fetchone()[0]
        bad += sum((u, i) in seen for u, i in db.execute("SELECT user_id, item_id FROM run_lists WHERE run_id=?", (rid,)))
    check(bad == 0, "every fitted list is free of train items")

    # --- re-rankers
    def lists(name):
        rid = db.execute("SELECT run_id FROM runs WHERE name=?", (name,)).fetchone()[0]
        out = {}
        for u, rank, i in db.execute("SELECT user_id, rank, item_id FROM run_lists WHERE run_id=? ORDER BY user_id, rank",
                                     (rid,)):
            out.setdefault(u, []).append(i)
        return out

    genres = {}
    for i, g in db.execute("SELECT item_id, genre_id FROM item_genres"):
        genres.setdefault(i, set()).add(g)

    def ild(lst):
        lst = lst[:10]
        ds = []
        for x in range(len(lst)):
            for y2 in range(x + 1, len(lst)):
                a_, b_ = genres.get(lst[x], set()), genres.get(lst[y2], set())
                ds.append(0.0 if not (a_ | b_) else 1 - len(a_ & b_) / len(a_ | b_))
        return np.mean(ds)

    run(a.cli, "rerank", ws, "--run", "als", "--method", "mmr", "--lambda", "1", "--name", "mmr1", "--quiet")
    check(lists("mmr1") == lists("als"), "mmr with lambda 1 returns the parent's lists")
    evaluated = {n for (n,) in db.execute("SELECT r.name FROM evaluations e JOIN runs r ON r.run_id = e.run_id")}
    check({"mmr1", "als"} <= evaluated, f"rerank stores the evaluations of the derived run and its parent {evaluated}")
    run(a.cli, "rerank", ws, "--run", "als", "--method", "mmr", "--lambda", "0.3", "--name", "mmr03", "--quiet")
    base = np.mean([ild(l) for l in lists("als").values()])
    div = np.mean([ild(l) for l in lists("mmr03").values()])
    check(div > base, f"mmr with lambda 0.3 raises ild@10 ({base:.4f} -> {div:.4f})")
    row = db.execute("SELECT r.kind, p.name, r.method FROM runs r JOIN runs p ON p.run_id = r.parent_run_id "
                     "WHERE r.name='mmr03'").fetchone()
    check(row == ("reranked", "als", "mmr"), f"derived run records kind, parent and method {row}")
    # compare without --base judges a derived run against its parent: the trade-off shows as
    # ild up (the aim of mmr, Carbonell & Goldstein 1998) next to the ranking metrics.
    cmp = json.loads(run(a.cli, "compare", ws, "--candidate", "mmr03", "--json", "-", "--quiet", "--bootstrap", "100",
                         "--no-segments", "--metric", "ild", "--metric", "ndcg"))
    check(cmp["base"] == "als", f"compare defaults the base to the candidate's parent ({cmp['base']})")
    diffs = {m["metric"]: m["mean_diff"] for m in cmp["metrics"]}
    check(diffs["ild"] > 0, f"compare shows the ild gained over the parent ({diffs['ild']:+.4f})")

    series = {}
    for i, s, part in db.execute("SELECT item_id, series_id, series_part FROM items WHERE series_id IS NOT NULL"):
        series[i] = (s, part)

    def violations(name):
        count = 0
        for u, lst in lists(name).items():
            higher = set()
            for i in lst:
                if i in series and series[i][1] > 1:
                    s, p = series[i]
                    earlier = [j for j, (s2, p2) in series.items() if s2 == s and p2 < p]
                    if any((u, j) not in seen and j not in higher for j in earlier):
                        count += 1
                higher.add(i)
        return count

    run(a.cli, "rerank", ws, "--run", "als", "--method", "series-order", "--name", "ordered", "--quiet")
    before, after = violations("als"), violations("ordered")
    check(before > 0 and after == 0, f"series-order: order violations {before} -> {after}")
    run(a.cli, "rerank", ws, "--run", "als", "--method", "burst-damp", "--name", "damped", "--quiet")
    check(sorted(map(sorted, lists("damped").values())) == sorted(map(sorted, lists("als").values())),
          "burst-damp reorders each list without changing its items")

    if FAILURES:
        print(f"{len(FAILURES)} check(s) failed")
        return 1
    print("all model checks passed")
    return 0


if __name__ == "__main__":
    sys.exit(main())
