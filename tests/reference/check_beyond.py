# SPDX-License-Identifier: MIT
"""Checks the beyond-accuracy measures of `slatewise evaluate` against scipy and numpy.

Random data with a fixed seed (catalog with genres and series, timestamped train and withheld
ratings, a run whose lists sometimes repeat train titles, users without lists and users with
lists only) is written as CSV, imported with `slatewise import` and `add-run`, evaluated with
`slatewise evaluate --json --per-user`, and compared at 1e-9 with:
  - calibration_kl per user: scipy.stats.entropy(p, (1 - a) q + a p), a = 0.01, p and q the
    genre distributions of the user's distinct train titles and top-k list, each title's genres
    sharing one unit of weight (Steck, RecSys 2018);
  - novelty per user and its run mean: numpy, mean of -log2((n_i + 1) / (N + 1)) (Zhou et al.,
    PNAS 2010, with +1 smoothing as documented in docs/metrics.md);
  - coverage: numpy, distinct titles in every user's top-k list / catalog size (list-only users
    included);
  - gini: numpy, sum((2i - n - 1) x_i) / (n sum x) over exposure counts sorted ascending, titles
    never shown included (closed form of the issue);
  - popularity_lift per user: popularity percentiles from scipy.stats.percentileofscore(kind='mean');
  - ild per user: numpy mean pairwise Jaccard distance of genre sets (Ziegler et al., WWW 2005);
  - seen_in_list per user and its total: numpy set membership;
  - `slatewise explain --json`: seen and hit markers, calibration_kl and the withheld order for
    a dozen users, against the same references.

Run with Debian's /usr/bin/python3:  check_beyond.py --cli PATH_TO_slatewise --workdir DIR
"""
import argparse
import csv
import itertools
import json
import math
import os
import shutil
import subprocess
import sys

import numpy as np
from scipy.stats import entropy, percentileofscore

TOL = 1e-9
K = 10
ALPHA = 0.01
failures = []


def check(name, actual, expected, tol=TOL):
    if expected is None or (isinstance(expected, float) and math.isnan(expected)):
        ok = actual is None
    else:
        ok = actual is not None and abs(actual - expected) <= tol
    if not ok:
        failures.append(f"{name}: slatewise {actual!r}, reference {expected!r}")


def write_csv(path, header, rows):
    with open(path, "w", newline="", encoding="utf-8") as f:
        w = csv.writer(f)
        w.writerow(header)
        w.writerows(rows)


def make_data(rng):
    n_items, n_users = 240, 70
    genres = ["Drama", "Comedy", "Mystery", "Western", "Musical", "Noir", "Heist"]
    catalog, item_genres = [], {}
    for j in range(n_items):
        item = f"t{j:03d}"
        g = sorted(rng.choice(genres, size=int(rng.integers(0, 4)), replace=False).tolist())
        series, part = ("", "")
        if j < 40:  # ten series of four parts
            series, part = f"Saga {j // 4}", str(j % 4 + 1)
        catalog.append((item, f"Picture {j}", 1960 + j % 60, ";".join(g), series, part))
        item_genres[item] = set(g)
    items = [c[0] for c in catalog]
    # Long-tailed popularity so that percentiles have ties and spread.
    weights = 1.0 / np.arange(1, n_items + 1) ** 0.8
    weights /= weights.sum()
    train, withheld, lists = [], [], []
    for u in range(n_users):
        user = f"member{u:02d}"
        n_train = int(rng.integers(1, 40))
        picks = rng.choice(n_items, size=n_train + 8, replace=False, p=weights)
        for t, j in enumerate(picks[:n_train]):
            train.append((user, items[j], int(rng.integers(1, 6)), 1700000000 + 3600 * t))
        if u % 7 == 0 and n_train > 2:  # a re-watch: n_i must count users, not rows
            train.append((user, items[picks[0]], 5, 1700000000 + 3600 * (n_train + 1)))
        for j in picks[n_train:n_train + int(rng.integers(1, 8))]:
            withheld.append((user, items[j], int(rng.integers(1, 6)), 1800000000))
        if u % 11 == 5:
            continue  # no list
        length = int(rng.integers(1, 16))
        pool = rng.permutation(n_items)[:length]
        if u % 4 == 0:  # sloppy lists that repeat train titles
            pool[: min(2, n_train)] = picks[: min(2, n_train)]
            pool = list(dict.fromkeys(pool.tolist()))
        for r, j in enumerate(pool):
            lists.append((user, r + 1, items[j], f"{10 - 0.1 * r:.2f}"))
    for v in range(5):  # users with a list but no ratings: count for coverage and gini only
        for r, j in enumerate(rng.permutation(n_items)[:12]):
            lists.append((f"visitor{v}", r + 1, items[j], ""))
    return catalog, item_genres, train, withheld, lists


def reference(catalog, item_genres, train, withheld, lists):
    items = [c[0] for c in catalog]
    genres = sorted({g for s in item_genres.values() for g in s})
    train_users = {}
    for user, item, _, _ in train:
        train_users.setdefault(item, set()).add(user)
    n_i = {i: len(train_users.get(i, ())) for i in items}
    N = len({row[0] for row in train})
    counts = np.array([n_i[i] for i in items], dtype=float)
    pct = {i: percentileofscore(counts, n_i[i], kind="mean") for i in items}
    info = {i: -math.log2((n_i[i] + 1) / (N + 1)) for i in items}

    history = {}
    for user, item, _, ts in sorted(train, key=lambda r: (r[0], r[3])):
        history.setdefault(user, [])
        if item not in history[user]:
            history[user].append(item)
    topk = {}
    for user, rank, item, _ in sorted(lists, key=lambda r: (r[0], r[1])):
        topk.setdefault(user, [])
        if len(topk[user]) < K:
            topk[user].append(item)

    def mix(titles):
        w = np.zeros(len(genres))
        for t in titles:
            gs = item_genres[t]
            for g in gs:
                w[genres.index(g)] += 1.0 / len(gs)
        return w

    per_user = {}
    for user in {row[0] for row in withheld}:
        lst = topk.get(user, [])
        hist = history.get(user, [])
        r = {}
        if lst:
            r["novelty"] = float(np.mean([info[i] for i in lst]))
            if len(lst) >= 2:
                d = []
                for a, b in itertools.combinations(lst, 2):
                    union = item_genres[a] | item_genres[b]
                    d.append(0.0 if not union else 1.0 - len(item_genres[a] & item_genres[b]) / len(union))
                r["ild"] = float(np.mean(d))
            else:
                r["ild"] = None
            p, q = mix(hist), mix(lst)
            if p.sum() > 0 and q.sum() > 0:
                p, q = p / p.sum(), q / q.sum()
                r["calibration_kl"] = float(entropy(p, (1 - ALPHA) * q + ALPHA * p))
            else:
                r["calibration_kl"] = None
            r["popularity_lift"] = (
                float(np.mean([pct[i] for i in lst]) - np.mean([pct[i] for i in hist])) if hist else None
            )
            r["seen_in_list"] = float(sum(1 for i in lst if i in set(hist)))
        else:
            for key in ("novelty", "ild", "calibration_kl", "popularity_lift", "seen_in_list"):
                r[key] = None
        per_user[user] = r

    exposure = {i: 0 for i in items}
    for lst in topk.values():
        for i in lst:
            exposure[i] += 1
    x = np.sort(np.array(list(exposure.values()), dtype=float))
    n = len(x)
    idx = np.arange(1, n + 1)
    run = {
        "coverage": len({i for lst in topk.values() for i in lst}) / len(items),
        "gini": float(np.sum((2 * idx - n - 1) * x) / (n * x.sum())),
        "novelty": float(np.mean([r["novelty"] for r in per_user.values() if r["novelty"] is not None])),
        "seen_in_list": sum(r["seen_in_list"] for r in per_user.values() if r["seen_in_list"] is not None),
    }
    return per_user, run


def run_cli(cli, *args):
    proc = subprocess.run([cli, *args], capture_output=True, text=True)
    if proc.returncode != 0:
        sys.exit(f"slatewise {' '.join(args)} failed ({proc.returncode}):\n{proc.stdout}\n{proc.stderr}")
    return proc


def cell(v):
    return None if v == "" else float(v)


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--cli", required=True)
    ap.add_argument("--workdir", required=True)
    a = ap.parse_args()
    shutil.rmtree(a.workdir, ignore_errors=True)
    os.makedirs(a.workdir)
    rng = np.random.default_rng(20261204)
    catalog, item_genres, train, withheld, lists = make_data(rng)
    p = lambda name: os.path.join(a.workdir, name)
    write_csv(p("catalog.csv"), ["item_id", "title", "year", "genres", "series", "series_part"], catalog)
    write_csv(p("train.csv"), ["user_id", "item_id", "rating", "timestamp"], train)
    write_csv(p("withheld.csv"), ["user_id", "item_id", "rating", "timestamp"], withheld)
    write_csv(p("lists.csv"), ["user_id", "rank", "item_id", "score"], lists)
    ws = p("ws.sqlite")
    run_cli(a.cli, "import", ws, "--catalog", p("catalog.csv"), "--train", p("train.csv"), "--test",
            p("withheld.csv"), "--quiet")
    run_cli(a.cli, "add-run", ws, "--name", "random", "--lists", p("lists.csv"), "--quiet")
    run_cli(a.cli, "evaluate", ws, "--k", str(K), "--bootstrap", "0", "--json", p("eval.json"), "--per-user",
            p("users.csv"), "--quiet")

    per_user, run = reference(catalog, item_genres, train, withheld, lists)
    with open(p("eval.json"), encoding="utf-8") as f:
        beyond = json.load(f)["runs"][0]["beyond"]
    with open(p("users.csv"), newline="", encoding="utf-8") as f:
        rows = list(csv.DictReader(f))
    if len(rows) != len(per_user):
        failures.append(f"per-user rows: slatewise {len(rows)}, reference {len(per_user)}")
    for row in rows:
        ref = per_user.get(row["user_id"])
        if ref is None:
            failures.append(f"unexpected user {row['user_id']}")
            continue
        for key in ("calibration_kl", "novelty", "ild", "popularity_lift", "seen_in_list"):
            check(f"{row['user_id']} {key}", cell(row[key]), ref[key])
    check("run coverage (numpy)", beyond["coverage"], run["coverage"])
    check("run gini (closed form, numpy)", beyond["gini"], run["gini"])
    check("run novelty (numpy)", beyond["novelty"], run["novelty"])
    check("run seen_in_list total", beyond["seen_in_list"], run["seen_in_list"])

    # `explain --json -` must show the same facts as the per-user results: seen markers as
    # counted by the numpy reference, hits against the withheld ratings, and the stored value.
    withheld_rating = {(u, i): r for u, i, r, _ in withheld}
    for user in sorted(per_user)[:12]:
        proc = run_cli(a.cli, "explain", ws, "--run", "random", "--user", user, "--k", str(K), "--bootstrap", "0",
                       "--json", "-", "--quiet")
        x = json.loads(proc.stdout)
        seen = sum(1 for r in x["list"] if r["seen"])
        check(f"explain {user} seen markers (numpy)", float(seen) if x["list"] else None, per_user[user]["seen_in_list"])
        for r in x["list"]:
            rating = withheld_rating.get((user, r["item_id"]))
            if bool(r["hit"]) != (rating is not None and rating >= 4.0):
                failures.append(f"explain {user} rank {r['rank']}: hit marker {r['hit']}, rating {rating}")
        check(f"explain {user} calibration_kl (scipy)", x["metrics"]["calibration_kl"]["user"],
              per_user[user]["calibration_kl"])
        ratings = [w["rating"] for w in x["withheld"]]
        if ratings != sorted(ratings, reverse=True):
            failures.append(f"explain {user}: withheld not sorted by rating descending")

    checked = sum(1 for r in per_user.values() if r["calibration_kl"] is not None)
    if checked < 30:
        failures.append(f"only {checked} users with a calibration_kl to compare; the data is too thin")
    if failures:
        print(f"{len(failures)} mismatches:")
        for line in failures[:40]:
            print("  " + line)
        return 1
    print(f"beyond-accuracy measures agree with scipy/numpy for {len(per_user)} users "
          f"({checked} calibration_kl values)")
    return 0


if __name__ == "__main__":
    sys.exit(main())
