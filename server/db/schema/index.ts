export * from './users.ts';
export * from './projects.ts';
export * from './trajectories.ts';
export * from './analyses.ts';
export * from './sharing.ts';
