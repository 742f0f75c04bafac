import { Injectable, signal } from '@angular/core';

/**
 * Reports the project page has seen runs finish with, per project, so the
 * report list can look again when a new one appears.
 */
@Injectable({ providedIn: 'root' })
export class FinishedRuns {
  private readonly byProject = signal<ReadonlyMap<number, ReadonlySet<number>>>(new Map());

  reportIds(projectId: number): ReadonlySet<number> {
    return this.byProject().get(projectId) ?? new Set();
  }

  note(projectId: number, reportIds: readonly number[]): void {
    const known = this.byProject().get(projectId) ?? new Set<number>();
    if (reportIds.every((id) => known.has(id))) return;
    this.byProject.update((map) => new Map(map).set(projectId, new Set([...known, ...reportIds])));
  }
}
