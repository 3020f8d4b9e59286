"""General-purpose reference for the cross-match benchmark (astropy + numpy).

Reads two CSV catalogs with the header ``l,b,v`` (Galactic degrees, LSR km/s), links them with
``SkyCoord.search_around_sky`` followed by a cut on |v_B - v_A|, and prints one JSON line
``{"pairs": N, "seconds": S}``; S covers only search_around_sky and the velocity cut.

    /usr/bin/python3 tests/bench/match_astropy.py --a A.csv --b B.csv \
        --radius-arcsec 60 --dv-kms 5 [--out-pairs P.csv]

``--out-pairs`` writes the linked row pairs (0-based ``ia,ib``, sorted by ia then ib).
"""

import argparse
import json
import time

import numpy as np
from astropy import units as u
from astropy.coordinates import SkyCoord, search_around_sky


def read_catalog(path):
    with open(path) as handle:
        header = handle.readline().strip().lower()
    if header != "l,b,v":
        raise SystemExit(f'{path} line 1: expected the header "l,b,v", got {header!r}')
    data = np.loadtxt(path, delimiter=",", skiprows=1, dtype=np.float64, ndmin=2)
    return data[:, 0], data[:, 1], data[:, 2]


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--a", required=True)
    parser.add_argument("--b", required=True)
    parser.add_argument("--radius-arcsec", type=float, required=True)
    parser.add_argument("--dv-kms", type=float, required=True)
    parser.add_argument("--out-pairs")
    args = parser.parse_args()

    la, ba, va = read_catalog(args.a)
    lb, bb, vb = read_catalog(args.b)
    coords_a = SkyCoord(l=la * u.deg, b=ba * u.deg, frame="galactic")
    coords_b = SkyCoord(l=lb * u.deg, b=bb * u.deg, frame="galactic")

    t0 = time.perf_counter()
    ia, ib, _, _ = search_around_sky(coords_a, coords_b, args.radius_arcsec * u.arcsec)
    keep = np.abs(vb[ib] - va[ia]) <= args.dv_kms
    ia, ib = ia[keep], ib[keep]
    seconds = time.perf_counter() - t0

    if args.out_pairs:
        order = np.lexsort((ib, ia))
        np.savetxt(
            args.out_pairs,
            np.column_stack((ia[order], ib[order])),
            fmt="%d",
            delimiter=",",
            header="ia,ib",
            comments="",
        )
    print(json.dumps({"pairs": int(ia.size), "seconds": round(seconds, 3)}))


if __name__ == "__main__":
    main()
