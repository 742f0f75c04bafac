/** Colours chosen for Ergodic's light theme. */
export const STAGE_COLOURS = {
  background: '#eef2f3',
  cell: '#40646b',
  selection: '#a16c2d',
  path: '#663d07',
} as const;

/** Hemisphere tints; the sprite shader imitates the same lights. */
export const STAGE_LIGHTS = { sky: 0xffffff, ground: 0x8a9799 } as const;
