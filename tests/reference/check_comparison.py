# SPDX-License-Identifier: MIT
"""Checks `slatewise compare` against scipy.stats.ttest_rel and scipy.stats.wilcoxon (Debian's
python3-scipy 1.10) through the real command line: import -> add-run -> evaluate -> compare.

Every user has one withheld item rated 3, so a run's per-user RMSE is |score - 3|: we choose the
scores so the per-user RMSE values of a base and a candidate run are the paired samples we want,
in several regimes (exact Wilcoxon distribution for n <= 50, the normal approximation above,
ties in |d|, zero differences that force the approximation even for small n, continuous values).
The paired values scipy sees are read from `evaluate --per-user` (not from the comparison), and
statistics must agree to 1e-9 (relative), p-values to 1e-6 (absolute).

Run with Debian's /usr/bin/python3: --cli PATH_TO_slatewise --workdir DIR
"""
import argparse
import csv
import json
import math
import os
import shutil
import subprocess
import sys
import warnings

import numpy as np
import scipy
import scipy.stats

STAT_TOL = 1e-9
P_TOL = 1e-6


def run(cli, *args):
    res = subprocess.run([cli, *args], capture_output=True, text=True)
    if res.returncode != 0:
        sys.exit(f"slatewise {' '.join(args)} failed ({res.returncode}):\n{res.stdout}\n{res.stderr}")
    return res


def regimes(rng):
    """(name, base errors, candidate errors); errors become per-user RMSE values."""
    out = []
    # Continuous values, no ties, no zeros: exact distribution (n <= 50).
    for n in (12, 20, 50):
        a = rng.uniform(0.2, 1.6, n)
        b = np.abs(a + rng.normal(-0.08, 0.25, n)) + 0.01
        out.append((f"exact-continuous-{n}", a, b))
    # Values on a 1/8 grid (exact in binary): ties in |d| but no zero: scipy 1.10 keeps the
    # exact branch (T+ truncated to an integer).
    for n in (15, 40):
        a = rng.integers(2, 12, n) / 8.0
        step = rng.choice([-3, -2, -1, 1, 2, 3], n) / 8.0
        b = a + step
        b = np.where(b <= 0, a + 2 / 8.0, b)
        out.append((f"exact-ties-{n}", a, b))
    # Zeros present with n <= 50: the approximation (with tie correction) is forced.
    for n in (25, 50):
        a = rng.integers(2, 12, n) / 8.0
        b = np.clip(a + rng.integers(-2, 3, n) / 8.0, 1 / 8.0, None)
        b[:3] = a[:3]  # at least three zero differences
        out.append((f"zeros-small-{n}", a, b))
    # Approximate regime (n > 50): continuous, and on the grid with ties and zeros.
    for n in (51, 300):
        a = rng.uniform(0.2, 1.6, n)
        b = np.abs(a + rng.normal(0.05, 0.3, n)) + 0.01
        out.append((f"approx-continuous-{n}", a, b))
    for n in (120, 400):
        a = rng.integers(1, 16, n) / 8.0
        b = np.clip(a + rng.integers(-3, 3, n) / 8.0, 1 / 8.0, None)
        out.append((f"approx-ties-zeros-{n}", a, b))
    return out


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--cli", required=True)
    parser.add_argument("--workdir", required=True)
    opts = parser.parse_args()
    print(f"scipy {scipy.__version__}")
    shutil.rmtree(opts.workdir, ignore_errors=True)
    os.makedirs(opts.workdir)
    wd = opts.workdir
    rng = np.random.default_rng(20261202)
    cases = regimes(rng)

    # Catalog and interactions: user "r{case}u{j}" has two train rows and one withheld item.
    with open(os.path.join(wd, "catalog.csv"), "w") as f:
        f.write("item_id,title,genres\n")
        for i in range(10):
            f.write(f"it{i},Item {i},{'Comedy' if i % 2 else 'Drama'}\n")
    users = []
    with open(os.path.join(wd, "train.csv"), "w") as tr, open(os.path.join(wd, "withheld.csv"), "w") as wh:
        tr.write("user_id,item_id,rating\n")
        wh.write("user_id,item_id,rating\n")
        for c, (name, a, _) in enumerate(cases):
            for j in range(len(a)):
                u = f"r{c}u{j}"
                users.append(u)
                tr.write(f"{u},it1,4\n{u},it2,2\n")
                wh.write(f"{u},it0,3\n")
    ws = os.path.join(wd, "check.sqlite")
    run(opts.cli, "import", ws, "--catalog", os.path.join(wd, "catalog.csv"), "--train",
        os.path.join(wd, "train.csv"), "--withheld", os.path.join(wd, "withheld.csv"), "--quiet")
    for c, (name, a, b) in enumerate(cases):
        for run_name, errors in ((f"base{c}", a), (f"cand{c}", b)):
            path = os.path.join(wd, f"{run_name}.csv")
            with open(path, "w") as f:
                f.write("user_id,item_id,score\n")
                for j, e in enumerate(errors):
                    f.write(f"r{c}u{j},it0,{3.0 + e!r}\n")
            run(opts.cli, "add-run", ws, "--name", run_name, "--scores", path, "--quiet")

    per_user = os.path.join(wd, "per_user.csv")
    run(opts.cli, "evaluate", ws, "--per-user", per_user, "--json", os.path.join(wd, "evaluate.json"), "--quiet")
    rmse = {}
    with open(per_user, newline="") as f:
        for row in csv.DictReader(f):
            if row["rmse"] != "":
                rmse[(row["run"], row["user_id"])] = float(row["rmse"])

    failures = []
    regimes_seen = {"exact": 0, "approx": 0}

    def close(what, got, want, tol, relative):
        if want is None or (isinstance(want, float) and math.isnan(want)):
            ok = got is None
        else:
            scale = max(1.0, abs(want)) if relative else 1.0
            ok = got is not None and abs(got - want) <= tol * scale
        status = "ok  " if ok else "FAIL"
        print(f"  {status} {what}: slatewise {got!r}, reference {want!r}")
        if not ok:
            failures.append(what)

    for c, (name, a, b) in enumerate(cases):
        out = os.path.join(wd, f"compare{c}.json")
        run(opts.cli, "compare", ws, "--base", f"base{c}", "--candidate", f"cand{c}", "--metric", "rmse",
            "--no-segments", "--bootstrap", "200", "--json", out, "--per-user", "--quiet")
        with open(out) as f:
            result = json.load(f)
        m = result["metrics"][0]
        ids = [f"r{c}u{j}" for j in range(len(a))]
        base = np.array([rmse[(f"base{c}", u)] for u in ids])
        cand = np.array([rmse[(f"cand{c}", u)] for u in ids])
        # The samples are the ones designed (scores pass through 32-bit floats, so ~1e-7).
        assert np.allclose(base, a, atol=1e-6) and np.allclose(cand, b, atol=1e-6), name
        d = cand - base
        zeros = int(np.sum(d == 0))
        exact = len(d) <= 50 and zeros == 0
        regimes_seen["exact" if exact else "approx"] += 1
        print(f"{name}: n = {len(d)}, zero differences {zeros}, distinct |d| {len(np.unique(np.abs(d[d != 0])))}, "
              f"scipy branch {'exact' if exact else 'normal approximation'}")
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            t = scipy.stats.ttest_rel(cand, base)          # scipy 1.10: tests cand - base
            w = scipy.stats.wilcoxon(cand, base)           # defaults: wilcox, correction=False, auto
        close("n", m["n"], len(d), 0, False)
        close("mean_diff", m["mean_diff"], float(np.mean(d)), STAT_TOL, True)
        close("t (scipy.stats.ttest_rel)", m["t"], float(t.statistic), STAT_TOL, True)
        close("df", m["df"], float(len(d) - 1), 0, False)
        close("p_t (scipy.stats.ttest_rel)", m["p_t"], float(t.pvalue), P_TOL, False)
        close("wilcoxon_w (scipy.stats.wilcoxon)", m["wilcoxon_w"], float(w.statistic), STAT_TOL, True)
        close("p_wilcoxon (scipy.stats.wilcoxon)", m["p_wilcoxon"], float(w.pvalue), P_TOL, False)
        if m["wilcoxon_exact"] != exact:
            failures.append(f"{name}: exact branch flag")
            print(f"  FAIL wilcoxon_exact {m['wilcoxon_exact']} but scipy 1.10 rule says {exact}")
        # Effect size mean/sd (sd with n - 1) and wins/ties/losses (rmse: lower is better), numpy.
        close("effect_size (numpy mean / std ddof=1)", m["effect_size"], float(np.mean(d) / np.std(d, ddof=1)), STAT_TOL, True)
        expected = (int(np.sum(d < -1e-9)), int(np.sum(np.abs(d) <= 1e-9)), int(np.sum(d > 1e-9)))
        got = (m["wins"], m["ties"], m["losses"])
        print(f"  {'ok  ' if got == expected else 'FAIL'} wins/ties/losses (numpy, lower is better): "
              f"slatewise {got}, numpy {expected}")
        if got != expected:
            failures.append(f"{name}: wins/ties/losses")
        lo, hi = m["ci"]
        if not (lo <= m["mean_diff"] <= hi):
            failures.append(f"{name}: interval does not contain the mean difference")
        # The comparison's own per-user values are the evaluation's.
        pu = result["per_user"][0]
        if not np.allclose(np.sort(np.array(pu["candidate"]) - np.array(pu["base"])), np.sort(d), atol=0, rtol=0):
            failures.append(f"{name}: per-user differences differ from evaluate --per-user")

    # Holm across metrics: rmse and mae over the same users give the same p twice; with two
    # tests Holm multiplies the smaller by 2 and keeps the result monotone (Holm 1979).
    out = os.path.join(wd, "compare-holm.json")
    run(opts.cli, "compare", ws, "--base", "base7", "--candidate", "cand7", "--metric", "rmse", "--metric",
        "mae", "--no-segments", "--bootstrap", "100", "--json", out, "--quiet")
    with open(out) as f:
        both = json.load(f)["metrics"]
    p = np.array([x["p_t"] for x in both])
    order = np.argsort(p, kind="stable")
    adjusted = np.empty(2)
    running = 0.0
    for rank, i in enumerate(order):
        running = max(running, min(1.0, (2 - rank) * p[i]))
        adjusted[i] = running
    print("Holm across 2 metrics (numpy, Holm 1979 step-down):")
    for x, want in zip(both, adjusted):
        close(f"p_holm {x['metric']}", x["p_holm"], float(want), 1e-12, False)

    print(f"regimes: {regimes_seen['exact']} exact, {regimes_seen['approx']} approximate")
    if regimes_seen["exact"] < 2 or regimes_seen["approx"] < 2:
        failures.append("both regimes must be exercised")
    if failures:
        sys.exit(f"{len(failures)} check(s) failed: {failures}")
    print("all comparison checks passed")


if __name__ == "__main__":
    main()
