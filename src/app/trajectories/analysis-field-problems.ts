import { analysisParamsSchema, PARAM_LIMITS } from '../../../shared/analysis-params';
import { buildParams, type AdvancedSettings } from './analysis-params-form';

export type FieldName = keyof AdvancedSettings;

/** The dialog's label of each field, so a message never shows a parameter's internal name. */
const LABELS: Partial<Record<FieldName, string>> = {
  fromFrame: 'the first frame', toFrame: 'the last frame', frameStride: 'the stride', discardPs: 'the discard',
  maxLagPs: 'the longest lag', fitStartPs: 'the fit start', fitEndPs: 'the fit end', gkStartPs: 'the plateau start', gkEndPs: 'the plateau end',
  zeroPadFactor: 'the zero padding', temperatureK: 'the temperature', degreesOfFreedom: 'the degrees of freedom', constraints: 'the constraints',
  rMaxA: 'r_max', binWidthA: 'the bin width', driftThresholdKTPerNs: 'the drift threshold', externalPressureBar: 'the barostat pressure',
};

/** The field a schema path belongs to: windows land on their end (where "must end after it starts" makes sense). */
function fieldOf(path: readonly PropertyKey[], s: AdvancedSettings): FieldName | null {
  const [head, sub] = path.map(String);
  if (head === 'fitWindow') return sub === 'startPs' ? 'fitStartPs' : 'fitEndPs';
  if (head === 'greenKuboWindow') return sub === 'startPs' ? 'gkStartPs' : 'gkEndPs';
  if (head === 'pair') return 'pair';
  if (head && head in s) return head as FieldName;
  return null;
}

/** A schema message in words: capitalised, a full stop, zod's wording for integers and bounds made plain. */
function inWords(message: string, field: FieldName): string {
  let text = message
    .replace(/^Invalid input: expected int, received number$/, 'must be a whole number')
    .replace(/^Too small: expected number to be >0$/, 'must be above 0')
    .replace(/^Too small: expected number to be >=(\S+)$/, 'must be at least $1')
    .replace(/^Too big: expected number to be <=(\S+)$/, 'must be at most $1')
    .replace(`rMaxA / binWidthA must be at most ${PARAM_LIMITS.maxBins} bins`, `r_max over the bin width makes more than ${PARAM_LIMITS.maxBins} bins`);
  if (/^must /.test(text)) text = `${LABELS[field] ?? 'this'} ${text}`;
  text = text.charAt(0).toUpperCase() + text.slice(1);
  return /[.!?]$/.test(text) ? text : `${text}.`;
}

/**
 * The frame range in the count people see (from 1, last frame included), checked
 * here so no message ever quotes the API's 0-based numbers back at them.
 */
function frameRangeProblems(s: AdvancedSettings, totalFrames: number | undefined, out: Partial<Record<FieldName, string>>): void {
  const whole = (v: number | null): v is number => v !== null && v !== undefined && Number.isInteger(v);
  const end = totalFrames === undefined ? '' : `; this trajectory's frames are 1 to ${totalFrames}`;
  if (whole(s.fromFrame)) {
    if (s.fromFrame < 1) out.fromFrame = `The first frame must be at least 1 (frames are counted from 1${end}).`;
    else if (totalFrames !== undefined && s.fromFrame > totalFrames) out.fromFrame = `The first frame must be at most ${totalFrames}${end}.`;
  }
  if (whole(s.toFrame)) {
    if (s.toFrame < 1) out.toFrame = `The last frame must be at least 1 (frames are counted from 1${end}).`;
    else if (totalFrames !== undefined && s.toFrame > totalFrames) out.toFrame = `The last frame must be at most ${totalFrames}${end}.`;
    else if (whole(s.fromFrame) && !out.fromFrame && s.toFrame < s.fromFrame) out.toFrame = `The last frame must not come before the first (${s.fromFrame}).`;
  }
}

/**
 * What is wrong with the advanced settings, field by field, in words, for
 * the message under each field: the frame range against the trajectory's
 * length (when known) and the half-filled windows the form itself catches,
 * then everything the shared schema (the one the server applies) refuses.
 * Empty when the settings can be sent.
 */
export function fieldProblems(s: AdvancedSettings, totalFrames?: number): Partial<Record<FieldName, string>> {
  const out: Partial<Record<FieldName, string>> = {};
  frameRangeProblems(s, totalFrames, out);
  const missing = (mode: 'auto' | 'manual', start: FieldName, end: FieldName, what: string) => {
    if (mode !== 'manual') return;
    const blank = (f: FieldName) => s[f] === null || s[f] === undefined || Number.isNaN(s[f]);
    if (blank(start)) out[start] = `Give the start of the ${what}, in ps.`;
    if (blank(end)) out[end] = `Give the end of the ${what}, in ps.`;
  };
  missing(s.fitMode, 'fitStartPs', 'fitEndPs', 'fit window');
  missing(s.gkMode, 'gkStartPs', 'gkEndPs', 'plateau window');
  const parsed = analysisParamsSchema.safeParse(buildParams(s).params);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      // A union reports each branch; the manual branch names the field, the others only repeat "invalid".
      const nested = issue.code === 'invalid_union' ? issue.errors.flat() : [issue];
      for (const i of nested) {
        const field = fieldOf([...issue.path, ...(i === issue ? [] : i.path)], s);
        if (field && !out[field] && i.code !== 'invalid_value') out[field] = inWords(i.message, field);
      }
    }
  }
  return out;
}
