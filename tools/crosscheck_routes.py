"""Independent check of `starloom routes` and `starloom neighbours` with SciPy.

Run by hand (not part of CI: it needs numpy and scipy from PyPI):

    pip install numpy scipy
    starloom populate --box 150,150,150 --seed 4242 --out s.csv
    starloom routes s.csv --jump 6 --json > r.json
    starloom routes s.csv --jump 6 --from A --to B --json > route.json   # optional
    starloom neighbours s.csv --k 3 --out nb.csv                          # optional
    python3 tools/crosscheck_routes.py s.csv 6 r.json [route.json] [nb.csv]

Systems are the catalogue rows whose `id` equals their `system` (the
primaries), at the primaries' positions, as starloom does. Links are the
pairs closer than the jump range (scipy.spatial.cKDTree.query_pairs, then
a strict `<`), regions are connected components, lanes the minimum
spanning forest (scipy.sparse.csgraph), the route a Dijkstra search. Each
figure is printed beside starloom's and the script exits 1 on a mismatch.
"""

import csv
import json
import sys

import numpy as np
from scipy.sparse import coo_matrix
from scipy.sparse.csgraph import connected_components, dijkstra, minimum_spanning_tree
from scipy.spatial import cKDTree


def main():
    if len(sys.argv) < 4:
        sys.exit(__doc__)
    catalogue, jump_ly, summary_path = sys.argv[1], float(sys.argv[2]), sys.argv[3]
    extra = sys.argv[4:]
    rows = list(csv.DictReader(open(catalogue, newline="")))
    primaries = sorted((r for r in rows if r["id"] == r["system"]), key=lambda r: int(r["system"]))
    ids = [int(r["system"]) for r in primaries]
    index = {s: k for k, s in enumerate(ids)}
    xyz = np.array([[float(r[c]) for c in ("x_ly", "y_ly", "z_ly")] for r in primaries])

    pairs = cKDTree(xyz).query_pairs(jump_ly, output_type="ndarray")
    dist = np.linalg.norm(xyz[pairs[:, 0]] - xyz[pairs[:, 1]], axis=1)
    keep = dist < jump_ly
    pairs, dist = pairs[keep], dist[keep]
    n = len(ids)
    graph = coo_matrix((dist, (pairs[:, 0], pairs[:, 1])), shape=(n, n)).tocsr()
    n_regions, labels = connected_components(graph, directed=False)
    sizes = np.bincount(labels)
    lanes = minimum_spanning_tree(graph)
    want = {
        "systems": n,
        "links": int(len(dist)),
        "regions": int(n_regions),
        "isolated_systems": int((sizes == 1).sum()),
        "largest_region": int(sizes.max()),
        "lanes": int(lanes.nnz),
        "lanes_ly": float(lanes.sum()),
    }
    got = json.load(open(summary_path))
    ok = True
    for key, value in want.items():
        same = abs(got[key] - value) <= 1e-9 * max(1.0, abs(value))
        ok &= same
        print(f"{key:18} starloom {got[key]:<22} scipy {value:<22} {'ok' if same else 'DIFFERENT'}")

    for path in extra:
        if path.endswith(".json"):
            route = json.load(open(path))
            a, b = index[route["path"][0]], index[route["path"][-1]]
            d, pred = dijkstra(graph, directed=False, indices=a, return_predecessors=True)
            back = [b]
            while back[-1] != a:
                back.append(pred[back[-1]])
            scipy_path = [ids[i] for i in reversed(back)]
            same = route["path"] == scipy_path and abs(route["distance_ly"] - d[b]) <= 1e-9 * d[b]
            ok &= same
            print(f"route              starloom {route['distance_ly']} ly, {route['jumps']} jumps; "
                  f"scipy {d[b]} ly, {len(scipy_path) - 1} jumps; {'ok' if same else 'DIFFERENT'}")
        else:
            listed = list(csv.DictReader(open(path, newline="")))
            k_max = max(int(r["rank"]) for r in listed)
            d, nearest = cKDTree(xyz).query(xyz, k=k_max + 1)
            worst = 0.0
            mismatches = 0
            for r in listed:
                a, k = index[int(r["system"])], int(r["rank"])
                worst = max(worst, abs(float(r["distance_ly"]) - d[a, k]))
                tie = any(abs(d[a, k] - d[a, j]) < 1e-6 for j in range(1, k_max + 1) if j != k)
                if int(r["neighbour"]) != ids[nearest[a, k]] and not tie:
                    mismatches += 1
            same = mismatches == 0 and worst <= 1e-6
            ok &= same
            print(f"neighbours         {len(listed)} rows, {mismatches} different neighbours, "
                  f"worst distance difference {worst:.2e} ly; {'ok' if same else 'DIFFERENT'}")
    sys.exit(0 if ok else 1)


if __name__ == "__main__":
    main()
