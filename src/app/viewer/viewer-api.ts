import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';
import { trajectorySchema, type TrajectoryDto } from '../../../shared/trajectory';
import { unwrap } from '../core/api-envelope';
import type { FrameRange } from './chunk-plan';
import { decodeFramesPayload, type FramesPayload } from './frames-payload-decoder';

/** The two endpoints the frame viewer reads. */
@Injectable({ providedIn: 'root' })
export class ViewerApi {
  private readonly http = inject(HttpClient);

  trajectory(id: string): Observable<TrajectoryDto> {
    return this.http.get(`/api/trajectories/${encodeURIComponent(id)}`).pipe(map(unwrap('trajectory', trajectorySchema)));
  }

  frames(id: string, range: FrameRange): Observable<FramesPayload> {
    return this.http.get(`/api/trajectories/${encodeURIComponent(id)}/frames`, {
      params: { from: range.from, to: range.to },
      responseType: 'arraybuffer',
    }).pipe(map(decodeFramesPayload));
  }
}
