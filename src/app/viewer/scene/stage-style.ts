import { VIEWER_BACKDROP } from '../../../../shared/element-colour';

/** Colours chosen for Ergodic's light theme. */
export const STAGE_COLOURS = {
  /** Element colours are derived to stand out against this (`shared/element-colour.ts`). */
  background: VIEWER_BACKDROP,
  cell: '#40646b',
  selection: '#a16c2d',
  path: '#663d07',
} as const;

/** Hemisphere tints; the sprite shader imitates the same lights. */
export const STAGE_LIGHTS = { sky: 0xffffff, ground: 0x8a9799 } as const;
