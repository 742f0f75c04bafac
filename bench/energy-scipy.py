# Reference timing for the energy analysis: per-frame LJ energy and virial with
# scipy's cKDTree (periodic boxsize) for the pairs and numpy for the sums.
# Reads raw Float32 positions and prints {"seconds", "frames", "meanPairEV"} as JSON.
import json, sys, time
import numpy as np
from scipy.spatial import cKDTree

path, n_atoms, n_frames, box, rc, sigma, eps = sys.argv[1:8]
n_atoms, n_frames = int(n_atoms), int(n_frames)
box, rc, sigma, eps = float(box), float(rc), float(sigma), float(eps)
pos = np.fromfile(path, dtype=np.float32).reshape(n_frames, n_atoms, 3).astype(np.float64)

t0 = time.perf_counter()
energies = np.empty(n_frames)
virials = np.empty(n_frames)
s2 = sigma * sigma
for f in range(n_frames):
    p = np.mod(pos[f], box)
    tree = cKDTree(p, boxsize=box)
    pairs = tree.query_pairs(rc, output_type='ndarray')
    d = p[pairs[:, 0]] - p[pairs[:, 1]]
    d -= box * np.round(d / box)
    r2 = (d * d).sum(axis=1)
    sr6 = (s2 / r2) ** 3
    energies[f] = (4 * eps * (sr6 * sr6 - sr6)).sum()
    virials[f] = (24 * eps * (2 * sr6 * sr6 - sr6)).sum()
seconds = time.perf_counter() - t0
print(json.dumps({"seconds": seconds, "frames": n_frames, "meanPairEV": float(energies.mean()), "meanVirialEV": float(virials.mean())}))
