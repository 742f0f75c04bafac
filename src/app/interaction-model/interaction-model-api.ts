import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';
import { z } from 'zod';
import { interactionPresetSchema, projectModelSchema, trajectoryModelViewSchema, type TrajectoryModelView } from '../../../shared/interaction-model-api';
import type { InteractionModel } from '../../../shared/interaction-model';
import type { InteractionPreset } from '../../../shared/interaction-presets';
import { unwrap, unwrapList } from '../core/api-envelope';

/** Where a model is stored: with one trajectory, or with a project for all its trajectories. */
export type ModelTarget = { kind: 'trajectory'; id: number } | { kind: 'project'; id: number };

const readView = unwrap('interactionModel', trajectoryModelViewSchema);
const readProject = unwrap('interactionModel', projectModelSchema);

@Injectable({ providedIn: 'root' })
export class InteractionModelApi {
  private readonly http = inject(HttpClient);

  presets(): Observable<InteractionPreset[]> {
    return this.http.get('/api/interaction-model-presets').pipe(map(unwrapList('presets', interactionPresetSchema)), map((list) => list as unknown as InteractionPreset[]));
  }

  trajectoryView(id: number): Observable<TrajectoryModelView> {
    return this.http.get(`/api/trajectories/${id}/interaction-model`).pipe(map(readView));
  }

  projectModel(id: number): Observable<InteractionModel | null> {
    return this.http.get(`/api/projects/${id}/interaction-model`).pipe(map(readProject), map((v) => v.model));
  }

  save(target: ModelTarget, model: InteractionModel): Observable<unknown> {
    return this.http.put(`/api/${target.kind === 'trajectory' ? 'trajectories' : 'projects'}/${target.id}/interaction-model`, { model });
  }

  remove(target: ModelTarget): Observable<unknown> {
    return this.http.delete(`/api/${target.kind === 'trajectory' ? 'trajectories' : 'projects'}/${target.id}/interaction-model`);
  }
}

export const presetListSchema = z.array(interactionPresetSchema);
