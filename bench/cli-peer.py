# The peer of `ergodic analyze FILE --analyses msd,vacf,vdos`: what a
# scientist would write with pandas and numpy for the same job on the same
# file. Reads the extended XYZ with pandas' C parser (header lines skipped),
# unwraps with the minimum image, and computes the MSD (FFT over all time
# origins), the VACF (FFT) and the VDOS (power spectrum of the velocities),
# printing D from the MSD slope and the Green-Kubo integral. Run by
# bench/end-to-end.ts with Debian's /usr/bin/python3 and python3-pandas.
import re
import sys

import numpy as np
import pandas as pd

path = sys.argv[1]
with open(path) as f:
    n_atoms = int(f.readline())
    first = f.readline()
    for _ in range(n_atoms):
        f.readline()
    f.readline()
    second = f.readline()
lattice = np.array(re.search(r'Lattice="([^"]+)"', first).group(1).split(), float).reshape(3, 3)
box = np.diag(lattice)
dt = float(re.search(r'Time=(\S+)', second).group(1)) - float(re.search(r'Time=(\S+)', first).group(1))

block = n_atoms + 2
table = pd.read_csv(path, sep=r'\s+', header=None, skiprows=lambda i: i % block < 2, usecols=[1, 2, 3, 4, 5, 6],
                    dtype=np.float64, engine='c')
values = table.to_numpy()
n_frames = values.shape[0] // n_atoms
pos = values[:, 0:3].reshape(n_frames, n_atoms, 3)
vel = values[:, 3:6].reshape(n_frames, n_atoms, 3)


def autocorr(x):
    t = x.shape[1]
    length = 1 << (2 * t - 1).bit_length()
    f = np.fft.rfft(x, n=length, axis=1)
    return np.fft.irfft(f * np.conj(f), n=length, axis=1)[:, :t]


d = np.diff(pos, axis=0)
d -= box * np.round(d / box)
unwrapped = np.concatenate([pos[:1], pos[:1] + np.cumsum(d, axis=0)], axis=0)
unwrapped -= unwrapped.mean(axis=1, keepdims=True)
x = unwrapped.transpose(1, 2, 0).reshape(-1, n_frames)
x = x - x.mean(axis=1, keepdims=True)
lags = np.arange(n_frames)
counts = n_frames - lags
sq = x * x
s1 = 2 * sq.sum(axis=1, keepdims=True) - np.concatenate([np.zeros((x.shape[0], 1)), np.cumsum(sq[:, :-1] + sq[:, :0:-1], axis=1)], axis=1)
msd = ((s1 - 2 * autocorr(x)) / counts).reshape(n_atoms, 3, n_frames).sum(axis=1).mean(axis=0)
window = slice(n_frames // 10, n_frames // 4)
slope = np.polyfit(lags[window] * dt, msd[window], 1)[0]

v = vel - vel.mean(axis=1, keepdims=True)
xv = v.transpose(1, 2, 0).reshape(-1, n_frames)
vacf = (autocorr(xv) / counts).reshape(n_atoms, 3, n_frames).sum(axis=1).mean(axis=0)
half = n_frames // 2
green_kubo = np.trapezoid(vacf[:half], dx=dt) / 3 if hasattr(np, 'trapezoid') else np.trapz(vacf[:half], dx=dt) / 3

hann = np.hanning(n_frames)
spectrum = (np.abs(np.fft.rfft(xv * hann, axis=1)) ** 2).sum(axis=0)
frequencies = np.fft.rfftfreq(n_frames, dt)
print(f'D(MSD) {slope / 6:.5g} A2/ps, D(Green-Kubo) {green_kubo:.5g} A2/ps, VDOS peak {frequencies[np.argmax(spectrum[1:]) + 1]:.4g} THz')
