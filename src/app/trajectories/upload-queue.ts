import { inject, Injectable, signal } from '@angular/core';
import { switchMap, throwError, type Subscription } from 'rxjs';
import { apiErrorMessage } from '../core/api-error';
import type { TrajectoryDto, TrajectoryMetadata } from '../../../shared/trajectory';
import { uploadRefusal } from '../../../shared/upload-policy';
import { TrajectoriesApi } from './trajectories-api';

export interface UploadItem {
  key: number;
  projectId: number;
  name: string;
  size: number;
  /** 0–100. */
  percent: number;
  state: 'sending' | 'stored' | 'failed' | 'cancelled';
  error?: string;
  /** Set once the server has stored the file; its inspection is followed through the trajectory. */
  trajectoryId?: number;
}

/** A file refused before sending, with the reason to show. */
class UploadRefused extends Error {}

/**
 * Uploads in flight, each with its own progress and cancel. Kept in a root
 * service so uploads keep going while the user moves between pages.
 */
@Injectable({ providedIn: 'root' })
export class UploadQueue {
  private readonly api = inject(TrajectoriesApi);
  private readonly running = new Map<number, Subscription>();
  private nextKey = 1;
  private readonly itemsState = signal<UploadItem[]>([]);
  readonly items = this.itemsState.asReadonly();

  add(projectId: number, files: readonly File[], onStored: (t: TrajectoryDto) => void, metadata: TrajectoryMetadata = {}): void {
    for (const file of files) {
      const key = this.nextKey++;
      this.itemsState.update((list) => [...list, { key, projectId, name: file.name, size: file.size, percent: 0, state: 'sending' }]);
      // A file over the site's limit is refused here, before gigabytes go up only to be refused at the end.
      const sent = this.api.uploadPolicy().pipe(switchMap((limits) => {
        const refusal = limits && uploadRefusal(file, limits);
        return refusal ? throwError(() => new UploadRefused(refusal)) : this.api.upload(projectId, file, metadata);
      }));
      const subscription = sent.subscribe({
        next: (event) => {
          if (event.kind === 'progress') {
            this.patch(key, { percent: event.total ? Math.min(99, Math.round((100 * event.loaded) / event.total)) : 0 });
          } else {
            this.patch(key, { percent: 100, state: 'stored', trajectoryId: event.trajectory.id });
            onStored(event.trajectory);
          }
        },
        error: (err: unknown) => {
          this.running.delete(key);
          this.patch(key, { state: 'failed', error: err instanceof UploadRefused ? err.message : apiErrorMessage(err, 'The upload failed.') });
        },
        complete: () => this.running.delete(key),
      });
      // A refusal from limits already read ends the subscription before this line.
      if (!subscription.closed) this.running.set(key, subscription);
    }
  }

  /** Aborting the request makes the server drop the partial object. */
  cancel(key: number): void {
    this.running.get(key)?.unsubscribe();
    this.running.delete(key);
    this.patch(key, { state: 'cancelled' });
  }

  dismiss(key: number): void {
    this.itemsState.update((list) => list.filter((i) => i.key !== key));
  }

  private patch(key: number, changes: Partial<UploadItem>): void {
    this.itemsState.update((list) => list.map((i) => (i.key === key ? { ...i, ...changes } : i)));
  }
}
