import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, type Observable } from 'rxjs';
import { seriesSchema, type CreateSeries, type PatchSeries, type SeriesDto } from '../../../shared/series-api';
import { unwrap } from '../core/api-envelope';
import { seriesUrl } from './series-source';

/** Writes to a series, one method per endpoint (links and comments go through ReportsApi); pages read with httpResource. */
@Injectable({ providedIn: 'root' })
export class SeriesApi {
  private readonly http = inject(HttpClient);

  create(projectId: number, body: CreateSeries): Observable<SeriesDto> {
    return this.http.post(`/api/projects/${projectId}/series`, body).pipe(map(unwrap('series', seriesSchema)));
  }

  update(seriesId: number, body: PatchSeries): Observable<SeriesDto> {
    return this.http.patch(seriesUrl(seriesId), body).pipe(map(unwrap('series', seriesSchema)));
  }

  delete(seriesId: number): Observable<void> {
    return this.http.delete<void>(seriesUrl(seriesId));
  }
}
