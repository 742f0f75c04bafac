import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { KELVIN_PER_THZ } from '../../../server/analysis/constants.ts';
import { Autocorrelator } from '../../../server/analysis/fft.ts';
import { FftMsd } from '../../../server/analysis/fft-msd.ts';
import { harmonicThermo } from '../../../server/analysis/harmonic-thermo.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';
import { referencePythonState } from '../../../scripts/services/reference-python.ts';

/**
 * Independent implementations in numpy/scipy. `npm test` installs Debian's
 * python3-numpy and python3-scipy when no interpreter has them, so these run
 * on every machine that can install packages; where it could but they are
 * still missing, the check fails instead of quietly skipping.
 */
const reference = referencePythonState();
const interpreter = reference.kind === 'ready' ? reference.interpreter : 'python3';
if (reference.kind === 'unavailable') console.warn(`numpy/scipy cross-check skipped: ${reference.reason}`);

function python(script: string, input: unknown): unknown {
  const r = spawnSync(interpreter, ['-c', script], { input: JSON.stringify(input), encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(r.stderr);
  return JSON.parse(r.stdout);
}

describe('numpy and scipy for the cross-check', () => {
  it('when this machine can install them, then an interpreter that imports both is found', () => {
    expect(reference.kind, reference.kind === 'installable' ? reference.reason : '').not.toBe('installable');
  });
});

describe.skipIf(reference.kind !== 'ready')('Cross-check against numpy / scipy', () => {
  const rng = new SeededRandom(31);
  const series = Float64Array.from({ length: 777 }, () => rng.normal());
  for (let i = 1; i < series.length; i++) series[i] += series[i - 1];

  it('when numpy computes the MSD by the direct double sum, then the FFT MSD agrees to 1e-9', () => {
    const expected = python(
      'import sys,json,numpy as np\nx=np.array(json.load(sys.stdin));T=len(x)\nprint(json.dumps([float(np.mean((x[m:]-x[:T-m])**2)) for m in range(T)]))',
      Array.from(series),
    ) as number[];
    const ours = new Float64Array(series.length);
    new FftMsd(series.length, series.length).accumulate(series, 0, ours);
    for (let m = 1; m < ours.length; m++) expect(Math.abs(ours[m] - expected[m])).toBeLessThan(1e-9 * Math.max(1, expected[m]));
  });

  it('when numpy.correlate gives the autocorrelation sums, then the FFT correlator agrees to 1e-9', () => {
    const expected = python(
      "import sys,json,numpy as np\nx=np.array(json.load(sys.stdin));c=np.correlate(x,x,'full')[len(x)-1:]\nprint(json.dumps(c.tolist()))",
      Array.from(series),
    ) as number[];
    const ours = new Autocorrelator(series.length).correlate(series, new Float64Array(series.length));
    for (let m = 0; m < ours.length; m++) expect(Math.abs(ours[m] - expected[m])).toBeLessThan(1e-9 * Math.abs(expected[0]));
  });

  it('when scipy integrates the Debye heat capacity at T/θ = 0.3 and 0.7, then the DOS route agrees to 1e-5', () => {
    const expected = python(
      'import sys,json,numpy as np\nfrom scipy.integrate import quad\nf=lambda x: x**4*np.exp(x)/np.expm1(x)**2\nprint(json.dumps([3*r**3*quad(f,0,1/r)[0] for r in json.load(sys.stdin)]))',
      [0.3, 0.7],
    ) as number[];
    const theta = 300, nuD = theta / KELVIN_PER_THZ, n = 20001;
    const freq = Float64Array.from({ length: n }, (_, k) => (k * nuD) / (n - 1));
    const dos = freq.map((v) => (9 * v * v) / nuD ** 3);
    [0.3, 0.7].forEach((ratio, i) => {
      const cv = harmonicThermo(freq, dos, ratio * theta, 1, 1).quantum.cvPerAtomKB / 3;
      expect(Math.abs(cv - expected[i])).toBeLessThan(1e-5);
    });
  });
});
