# Reference timings: the same algorithms as the Ergodic engine, written in numpy.
# Reads a raw Float32 trajectory and prints per-stage seconds as JSON.
import json, sys, time
import numpy as np

path, n_atoms, n_frames, dt, box, r_max, bin_w, rdf_frames = sys.argv[1:9]
n_atoms, n_frames, rdf_frames = int(n_atoms), int(n_frames), int(rdf_frames)
dt, box, r_max, bin_w = float(dt), float(box), float(r_max), float(bin_w)
raw = np.fromfile(path, dtype=np.float32)
half = n_atoms * n_frames * 3
pos = raw[:half].reshape(n_frames, n_atoms, 3).astype(np.float64)
vel = raw[half:].reshape(n_frames, n_atoms, 3).astype(np.float64)
mass = 39.95
out = {}

def autocorr(x, n_lags):
    # x: (series, T); zero padding to a power of two >= 2T
    T = x.shape[1]
    L = 1 << (2 * T - 1).bit_length()
    f = np.fft.rfft(x, n=L, axis=1)
    return np.fft.irfft(f * np.conj(f), n=L, axis=1)[:, :n_lags]

t0 = time.perf_counter()
d = np.diff(pos, axis=0)
d -= box * np.round(d / box)
u = np.concatenate([pos[:1], pos[:1] + np.cumsum(d, axis=0)], axis=0)
u -= u.mean(axis=1, keepdims=True)
n_lags = (n_frames - 1) // 2 + 1
x = u.transpose(1, 2, 0).reshape(-1, n_frames)
x = x - x.mean(axis=1, keepdims=True)
s2 = autocorr(x, n_lags)
D = x * x
q = 2 * D.sum(axis=1)
cum = np.zeros((x.shape[0], n_lags))
cum[:, 0] = q
for m in range(1, n_lags):
    q = q - D[:, m - 1] - D[:, n_frames - m]
    cum[:, m] = q
norm = (n_frames - np.arange(n_lags))
msd = ((cum - 2 * s2) / norm).reshape(n_atoms, 3, n_lags).sum(axis=1).mean(axis=0)
out['msd'] = time.perf_counter() - t0

t0 = time.perf_counter()
v = vel - vel.mean(axis=1, keepdims=True)
xv = v.transpose(1, 2, 0).reshape(-1, n_frames)
c = autocorr(xv, n_lags) / norm
vacf = c.reshape(n_atoms, 3, n_lags).sum(axis=1)
mw = mass * vacf.sum(axis=0)
out['vacf'] = time.perf_counter() - t0

t0 = time.perf_counter()
# Power spectrum of Hann-windowed velocities over the whole run, mass-weighted.
w = np.hanning(n_frames)
L = 1 << (n_frames - 1).bit_length()
p = np.abs(np.fft.rfft(xv * w, n=L, axis=1)) ** 2
spec = mass * p.sum(axis=0) * dt / (w * w).sum()
dos = 2 * (3 * n_atoms - 3) / (mass * (xv * xv).mean(axis=1).sum()) * spec
out['vdos'] = time.perf_counter() - t0

t0 = time.perf_counter()
n_bins = int(round(r_max / bin_w))
hist = np.zeros(n_bins)
iu = np.triu_indices(n_atoms, 1)
for f in range(rdf_frames):
    p = pos[f]
    dd = p[iu[0]] - p[iu[1]]
    dd -= box * np.round(dd / box)
    r = np.sqrt((dd * dd).sum(axis=1))
    hist += np.histogram(r[r < r_max], bins=n_bins, range=(0, r_max))[0]
out['rdf'] = (time.perf_counter() - t0) * n_frames / rdf_frames

t0 = time.perf_counter()
ke = 0.5 * mass * (vel * vel).sum(axis=(1, 2))
temps = 2 * ke / ((3 * n_atoms - 3) * 0.831446261815324)
out['thermo'] = time.perf_counter() - t0
print(json.dumps(out))
