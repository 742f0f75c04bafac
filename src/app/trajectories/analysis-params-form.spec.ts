import { describe, expect, it } from 'vitest';
import { analysisParamsSchema } from '../../../shared/analysis-params';
import { buildParams, settingsFromParams, type AdvancedSettings } from './analysis-params-form';

const defaults: AdvancedSettings = {
  fromFrame: null, toFrame: null, frameStride: null, discardPs: null, species: [], maxLagPs: null, removeComDrift: true, fitMode: 'auto', fitStartPs: null, fitEndPs: null,
  gkMode: 'auto', gkStartPs: null, gkEndPs: null, window: 'hann', zeroPadFactor: 1, temperatureK: null,
  degreesOfFreedom: null, constraints: null, rMaxA: null, binWidthA: 0.05, pair: null, sqWindow: 'lorch',
};

describe('advanced analysis settings', () => {
  it('when nothing is changed, then the parameters are the engine defaults and pass the shared schema', () => {
    const { params, problems } = buildParams(defaults);
    expect(problems).toEqual([]);
    expect(analysisParamsSchema.parse(params)).toEqual(analysisParamsSchema.parse({}));
  });
  it('when a manual fit window lacks its end, then it says to give both ends', () => {
    expect(buildParams({ ...defaults, fitMode: 'manual', fitStartPs: 1 }).problems).toEqual(['Give both ends of the diffusion fit window, in ps.']);
  });
  it('when the window ends before it starts, then the shared schema refuses it', () => {
    const { params } = buildParams({ ...defaults, fitMode: 'manual', fitStartPs: 5, fitEndPs: 2 });
    expect(analysisParamsSchema.safeParse(params).success).toBe(false);
  });
  it('when a species pair is chosen, then it is sent as two species', () => {
    expect(buildParams({ ...defaults, pair: 'Na–Cl' }).params.pair).toEqual(['Na', 'Cl']);
  });
  it('when temperature and constraints are left empty, then neither is sent, so the kinetic temperature and the trajectory\'s constraints apply', () => {
    const { params } = buildParams(defaults);
    expect(params).not.toHaveProperty('temperatureK');
    expect(params).not.toHaveProperty('constraints');
    expect(buildParams({ ...defaults, constraints: 0, temperatureK: 250 }).params).toMatchObject({ constraints: 0, temperatureK: 250 });
  });
  it('when a frame range counted from 1 is given, then the API gets its 0-based start and exclusive end, with the stride and discard', () => {
    const { params } = buildParams({ ...defaults, fromFrame: 100, toFrame: 900, frameStride: 4, discardPs: 2.5 });
    expect(analysisParamsSchema.parse(params)).toMatchObject({ fromFrame: 99, toFrame: 900, frameStride: 4, discardPs: 2.5 });
    expect(analysisParamsSchema.parse(buildParams({ ...defaults, fromFrame: 1, toFrame: 1 }).params)).toMatchObject({ fromFrame: 0, toFrame: 1 });
  });
});

describe('settings from a stored run', () => {
  it('when a run is opened to adjust, then the panel shows its parameters and sends the same ones back', () => {
    const stored = analysisParamsSchema.parse({
      species: ['Ar'], maxLagPs: 20, fitWindow: { mode: 'manual', startPs: 2, endPs: 12 }, window: 'blackman', zeroPadFactor: 4,
      temperatureK: 120, rMaxA: 9, binWidthA: 0.02, pair: ['Ar', 'Kr'], sqWindow: 'none', removeComDrift: false,
    });
    const settings = settingsFromParams(stored, defaults);
    expect(settings).toEqual(expect.objectContaining({ fitMode: 'manual', fitStartPs: 2, fitEndPs: 12, gkMode: 'auto', pair: 'Ar–Kr', temperatureK: 120 }));
    expect(analysisParamsSchema.parse(buildParams(settings).params)).toEqual(stored);
  });

  it('when a run used a frame range, then the panel shows it counted from 1 and sends the same range back', () => {
    const stored = analysisParamsSchema.parse({ fromFrame: 99, toFrame: 900, frameStride: 4, discardPs: 2.5 });
    const settings = settingsFromParams(stored, defaults);
    expect(settings).toEqual(expect.objectContaining({ fromFrame: 100, toFrame: 900, frameStride: 4, discardPs: 2.5 }));
    expect(analysisParamsSchema.parse(buildParams(settings).params)).toEqual(stored);
    expect(settingsFromParams(analysisParamsSchema.parse({}), defaults)).toEqual(expect.objectContaining({ fromFrame: null, toFrame: null, frameStride: null, discardPs: null }));
  });

  it('when the stored parameters do not parse, then the panel keeps its defaults', () => {
    expect(settingsFromParams({ zeroPadFactor: 'lots' }, defaults)).toEqual(defaults);
  });
});

describe('problems under each advanced field', async () => {
  const { fieldProblems } = await import('./analysis-field-problems');
  it('when a manual fit window lacks its end, then the end field asks for it and no internal name shows', () => {
    expect(fieldProblems({ ...defaults, fitMode: 'manual', fitStartPs: 1 })).toEqual({ fitEndPs: 'Give the end of the fit window, in ps.' });
  });
  it('when the plateau window ends before it starts, then its end field says so in words', () => {
    expect(fieldProblems({ ...defaults, gkMode: 'manual', gkStartPs: 5, gkEndPs: 2 })).toEqual({ gkEndPs: 'The window must end after it starts.' });
  });
  it('when numbers are out of range or not whole, then each field names itself in words', () => {
    const problems = fieldProblems({ ...defaults, zeroPadFactor: 1.5, temperatureK: -3, binWidthA: 2, fromFrame: -1 });
    expect(problems).toEqual({
      zeroPadFactor: 'The zero padding must be a whole number.', temperatureK: 'The temperature must be above 0.',
      binWidthA: 'The bin width must be at most 1 Å.', fromFrame: 'The first frame must be at least 1 (frames are counted from 1).',
    });
    for (const text of Object.values(problems)) expect(text).not.toMatch(/[a-z][A-Z]|:/);
  });
  it('when the range runs past a 400-frame trajectory or backwards, then the field says so counting from 1', () => {
    expect(fieldProblems({ ...defaults, fromFrame: 401 }, 400)).toEqual({ fromFrame: "The first frame must be at most 400; this trajectory's frames are 1 to 400." });
    expect(fieldProblems({ ...defaults, toFrame: 401 }, 400)).toEqual({ toFrame: "The last frame must be at most 400; this trajectory's frames are 1 to 400." });
    expect(fieldProblems({ ...defaults, fromFrame: 0, toFrame: 0 }, 400)).toEqual({
      fromFrame: "The first frame must be at least 1 (frames are counted from 1; this trajectory's frames are 1 to 400).",
      toFrame: "The last frame must be at least 1 (frames are counted from 1; this trajectory's frames are 1 to 400).",
    });
    expect(fieldProblems({ ...defaults, fromFrame: 50, toFrame: 40 }, 400)).toEqual({ toFrame: 'The last frame must not come before the first (50).' });
    expect(fieldProblems({ ...defaults, fromFrame: 1, toFrame: 400 }, 400)).toEqual({});
  });
  it('when everything is sendable, then no field has a problem', () => {
    expect(fieldProblems(defaults)).toEqual({});
  });
});
