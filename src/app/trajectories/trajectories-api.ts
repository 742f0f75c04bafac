import { HttpClient, HttpEventType, HttpRequest, type HttpEvent } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { filter, map, type Observable } from 'rxjs';
import type { AnalysisRunDto, StartAnalysis } from '../../../shared/analysis-run';
import type { TrajectoryDto, TrajectoryMetadata } from '../../../shared/trajectory';

/** Progress of one upload: bytes sent, then the stored trajectory. */
export type UploadEvent = { kind: 'progress'; loaded: number; total: number } | { kind: 'done'; trajectory: TrajectoryDto };

/** The trajectory, analysis and job endpoints, one method each. */
@Injectable({ providedIn: 'root' })
export class TrajectoriesApi {
  private readonly http = inject(HttpClient);

  list(projectId: number): Observable<TrajectoryDto[]> {
    return this.http.get<TrajectoryDto[]>(`/api/projects/${projectId}/trajectories`);
  }

  get(id: number): Observable<TrajectoryDto> {
    return this.http.get<TrajectoryDto>(`/api/trajectories/${id}`);
  }

  upload(projectId: number, file: File): Observable<UploadEvent> {
    const body = new FormData();
    body.append('file', file, file.name);
    const request = new HttpRequest('POST', `/api/projects/${projectId}/trajectories`, body, { reportProgress: true });
    return this.http.request<TrajectoryDto>(request).pipe(
      filter((e: HttpEvent<TrajectoryDto>) => e.type === HttpEventType.UploadProgress || e.type === HttpEventType.Response),
      map((e): UploadEvent => e.type === HttpEventType.UploadProgress
        ? { kind: 'progress', loaded: e.loaded, total: e.total ?? file.size }
        : { kind: 'done', trajectory: (e as { body: TrajectoryDto }).body }),
    );
  }

  update(id: number, metadata: TrajectoryMetadata): Observable<TrajectoryDto> {
    return this.http.patch<TrajectoryDto>(`/api/trajectories/${id}`, metadata);
  }

  delete(id: number): Observable<void> {
    return this.http.delete<void>(`/api/trajectories/${id}`);
  }

  startAnalysis(id: number, body: StartAnalysis): Observable<AnalysisRunDto> {
    return this.http.post<AnalysisRunDto>(`/api/trajectories/${id}/analyses`, body);
  }

  runs(trajectoryId: number): Observable<AnalysisRunDto[]> {
    return this.http.get<AnalysisRunDto[]>(`/api/trajectories/${trajectoryId}/analyses`);
  }

  job(id: number): Observable<AnalysisRunDto> {
    return this.http.get<AnalysisRunDto>(`/api/jobs/${id}`);
  }

  cancelJob(id: number): Observable<AnalysisRunDto> {
    return this.http.post<AnalysisRunDto>(`/api/jobs/${id}/cancel`, {});
  }

  cutUrl(id: number, from: number, to: number, stride: number): string {
    return `/api/trajectories/${id}/cut?from=${from}&to=${to}&stride=${stride}`;
  }
}
