import { randomUUID } from 'node:crypto';

/**
 * Where things live in the object store. Everything a project owns sits
 * under `projects/<id>/`, and everything a trajectory owns (its upload, the
 * indexes and frame stores built from it, its reports' curves) sits under
 * that trajectory's own folder, so deleting an owner is deleting a prefix:
 * nothing written later by a job, under any name, can outlive it.
 */
export function projectPrefix(projectId: number): string {
  return `projects/${projectId}/`;
}

/** Object keys never contain user text beyond a sanitised base name. */
export function objectKeyFor(projectId: number, fileName: string): string {
  const base = fileName.split(/[\\/]/).pop() ?? '';
  const safe = base.normalize('NFKC').replace(/[^\w.+-]+/g, '_').replace(/^\.+/, '').slice(-120) || 'trajectory';
  return `${projectPrefix(projectId)}trajectories/${randomUUID()}/${safe}`;
}

const TRAJECTORY_FOLDER = /^(projects\/\d+\/trajectories\/[^/]+\/)[^/]+$/;

/**
 * The folder holding an upload and everything derived from it. A key from
 * before folders (none are written now) owns itself and whatever was named
 * after it.
 */
export function trajectoryPrefix(objectKey: string): string {
  const match = TRAJECTORY_FOLDER.exec(objectKey);
  if (match) return match[1]!;
  if (!objectKey || objectKey.endsWith('/')) throw new Error(`object key "${objectKey}" names no object`);
  return objectKey;
}

/** A report's curves, kept beside the trajectory they were computed from. */
export function curvesKeyFor(trajectoryObjectKey: string, runId: number): string {
  const prefix = trajectoryPrefix(trajectoryObjectKey);
  return `${prefix}${prefix.endsWith('/') ? '' : '.'}reports/run-${runId}/curves.json.gz`;
}

/** The binary frame store built from an upload at inspection, inside the trajectory's folder. */
export function frameStorePrefixFor(trajectoryObjectKey: string): string {
  const prefix = trajectoryPrefix(trajectoryObjectKey);
  return `${prefix}${prefix.endsWith('/') ? '' : '.'}frames/`;
}
