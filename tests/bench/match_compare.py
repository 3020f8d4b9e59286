"""Runs the cross-match benchmark of both engines on the same files and compares the pair sets.

    /usr/bin/python3 tests/bench/match_compare.py [--n 1000000] [--radius-arcsec 60] [--dv-kms 5]
        [--seed 1] [--repeats 3] [--dir /tmp/lanewise-match-bench]

Generates two random Galactic-plane catalogs of N sources (``npm run bench:match -- --generate``),
then runs ``npm run bench:match`` (Lanewise) and ``tests/bench/match_astropy.py`` (astropy
``search_around_sky`` + velocity cut) alternately ``--repeats`` times on the CSV files, checks that
both engines return the identical pair list, and prints one JSON line with every run, the medians
and the ratio of median times.
"""

import argparse
import filecmp
import json
import os
import statistics
import subprocess
import sys

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))


def run_json(command):
    output = subprocess.run(command, cwd=ROOT, check=True, capture_output=True, text=True).stdout
    return json.loads(output.strip().splitlines()[-1])


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--n", type=int, default=1_000_000)
    parser.add_argument("--radius-arcsec", type=float, default=60)
    parser.add_argument("--dv-kms", type=float, default=5)
    parser.add_argument("--seed", type=int, default=1)
    parser.add_argument("--repeats", type=int, default=3)
    parser.add_argument("--dir", default="/tmp/lanewise-match-bench")
    args = parser.parse_args()

    tolerances = ["--radius-arcsec", str(args.radius_arcsec), "--dv-kms", str(args.dv_kms)]
    npm = ["npm", "run", "--silent", "bench:match", "--"]
    run_json(npm + ["--generate", str(args.n), "--seed", str(args.seed), "--out-dir", args.dir] + tolerances)
    files = ["--a", os.path.join(args.dir, "A.csv"), "--b", os.path.join(args.dir, "B.csv")]
    ours_pairs = os.path.join(args.dir, "pairs_lanewise.csv")
    theirs_pairs = os.path.join(args.dir, "pairs_astropy.csv")

    ours, theirs = [], []
    for _ in range(args.repeats):
        ours.append(run_json(npm + files + tolerances + ["--out-pairs", ours_pairs]))
        theirs.append(
            run_json(
                [sys.executable, "tests/bench/match_astropy.py"]
                + files
                + tolerances
                + ["--out-pairs", theirs_pairs]
            )
        )

    ours_median = statistics.median(r["seconds"] for r in ours)
    theirs_median = statistics.median(r["seconds"] for r in theirs)
    print(
        json.dumps(
            {
                "n": args.n,
                "radiusArcsec": args.radius_arcsec,
                "dvKms": args.dv_kms,
                "identicalPairs": filecmp.cmp(ours_pairs, theirs_pairs, shallow=False),
                "lanewise": {
                    "pairs": ours[0]["pairs"],
                    "medianSeconds": ours_median,
                    "maxPeakRssMb": max(r["peakRssMb"] for r in ours),
                    "runs": [r["seconds"] for r in ours],
                },
                "astropy": {
                    "pairs": theirs[0]["pairs"],
                    "medianSeconds": theirs_median,
                    "runs": [r["seconds"] for r in theirs],
                },
                "timeRatio": round(ours_median / theirs_median, 3),
            }
        )
    )


if __name__ == "__main__":
    main()
