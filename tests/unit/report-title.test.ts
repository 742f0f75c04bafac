import { describe, expect, it } from 'vitest';
import { keySettings, reportTitle } from '../../shared/report-title.ts';

describe('reportTitle', () => {
  it('when every setting is the default, then the title is the file and the analyses', () => {
    expect(reportTitle('argon.extxyz', ['msd', 'vacf'], {})).toBe('argon.extxyz: MSD, VACF');
  });

  it('when a fit window is set by hand, then the title says so, and two such reports read differently', () => {
    const early = reportTitle('argon.extxyz', ['msd'], { fitWindow: { mode: 'manual', startPs: 1, endPs: 5 } });
    const late = reportTitle('argon.extxyz', ['msd'], { fitWindow: { mode: 'manual', startPs: 5, endPs: 50 } });
    expect(early).toBe('argon.extxyz: MSD — fit 1–5 ps');
    expect(late).toBe('argon.extxyz: MSD — fit 5–50 ps');
  });

  it('when a setting belongs to an analysis that did not run, then it is left out', () => {
    expect(keySettings(['msd'], { rMaxA: 12, window: 'blackman', temperatureK: 300 })).toEqual([]);
    expect(keySettings(['rdf', 'vdos'], { rMaxA: 12, window: 'blackman', temperatureK: 300 }))
      .toEqual(['blackman window', 'Cv at 300 K', 'r ≤ 12 Å']);
  });

  it('when species, masses or drift removal change, then every analysis names them', () => {
    expect(keySettings(['thermo'], { species: ['O', 'H'], removeComDrift: false, masses: { H: 2.014 } }))
      .toEqual(['species O, H', 'centre-of-mass drift kept', 'masses H 2.014 u']);
  });

  it('when the title would be longer than the column holds, then it is cut with an ellipsis', () => {
    const long = reportTitle('x'.repeat(250), ['msd'], { species: ['Ar'] });
    expect(long).toHaveLength(255);
    expect(long.endsWith('…')).toBe(true);
  });
});
