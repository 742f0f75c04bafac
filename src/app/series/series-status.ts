import type { MemberStatus, SeriesStatus } from '../../../shared/series-api';

export const SERIES_STATUS_WORDS: Record<SeriesStatus, string> = {
  running: 'Analyses running',
  ready: 'Ready',
  incomplete: 'Incomplete',
};

export const MEMBER_STATUS_WORDS: Record<MemberStatus, string> = {
  waiting: 'Waiting for inspection',
  queued: 'Queued',
  running: 'Running',
  done: 'Analysed',
  failed: 'Failed',
  cancelled: 'Cancelled',
};
