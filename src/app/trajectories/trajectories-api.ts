import { HttpClient, HttpEventType, HttpRequest, type HttpEvent } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { catchError, filter, map, of, shareReplay, type Observable } from 'rxjs';
import { analysisRunSchema, type AnalysisRunDto, type StartAnalysis } from '../../../shared/analysis-run';
import { trajectorySchema, type TrajectoryDto, type TrajectoryMetadata } from '../../../shared/trajectory';
import { runEstimateSchema, type RunEstimate } from '../../../shared/run-estimate';
import { uploadPolicySchema, type UploadPolicy } from '../../../shared/upload-policy';
import { unwrap, unwrapList } from '../core/api-envelope';

/** Progress of one upload: bytes sent, then the stored trajectory. */
export type UploadEvent = { kind: 'progress'; loaded: number; total: number } | { kind: 'done'; trajectory: TrajectoryDto };

const readTrajectory = unwrap('trajectory', trajectorySchema);
const readJob = unwrap('job', analysisRunSchema);
const readEstimate = unwrap('estimate', runEstimateSchema);

/** The trajectory, analysis and job endpoints, one method each. */
@Injectable({ providedIn: 'root' })
export class TrajectoriesApi {
  private readonly http = inject(HttpClient);
  private limits: Observable<UploadPolicy | null> | null = null;

  /** The site's upload limits, read once; null when they could not be read (the server still checks). */
  uploadPolicy(): Observable<UploadPolicy | null> {
    this.limits ??= this.http.get('/api/upload-policy').pipe(
      map(unwrap('uploadPolicy', uploadPolicySchema)),
      catchError(() => {
        this.limits = null;
        return of(null);
      }),
      shareReplay(1),
    );
    return this.limits;
  }

  list(projectId: number): Observable<TrajectoryDto[]> {
    return this.http.get(`/api/projects/${projectId}/trajectories`).pipe(map(unwrapList('trajectories', trajectorySchema)));
  }

  get(id: number): Observable<TrajectoryDto> {
    return this.http.get(`/api/trajectories/${id}`).pipe(map(readTrajectory));
  }

  /** Sends one file with the metadata given before the upload; blank fields are left to the file and the server. */
  upload(projectId: number, file: File, metadata: TrajectoryMetadata = {}): Observable<UploadEvent> {
    const body = new FormData();
    // Text fields before the file, so the server has them by the time the bytes arrive.
    for (const [key, value] of Object.entries(metadata)) {
      if (value !== null && value !== undefined && value !== '') body.append(key, typeof value === 'object' ? JSON.stringify(value) : String(value));
    }
    body.append('file', file, file.name);
    const request = new HttpRequest('POST', `/api/projects/${projectId}/trajectories`, body, { reportProgress: true });
    return this.http.request<unknown>(request).pipe(
      filter((e: HttpEvent<unknown>) => e.type === HttpEventType.UploadProgress || e.type === HttpEventType.Response),
      map((e): UploadEvent => e.type === HttpEventType.UploadProgress
        ? { kind: 'progress', loaded: e.loaded, total: e.total ?? file.size }
        : { kind: 'done', trajectory: readTrajectory((e as { body: unknown }).body) }),
    );
  }

  update(id: number, metadata: TrajectoryMetadata): Observable<TrajectoryDto> {
    return this.http.patch(`/api/trajectories/${id}`, metadata).pipe(map(readTrajectory));
  }

  /** One metadata change for several trajectories of a project, all or none. */
  updateMany(projectId: number, ids: number[], changes: Omit<TrajectoryMetadata, 'name'>): Observable<TrajectoryDto[]> {
    return this.http.patch(`/api/projects/${projectId}/trajectories`, { ids, changes }).pipe(map(unwrapList('trajectories', trajectorySchema)));
  }

  delete(id: number): Observable<void> {
    return this.http.delete<void>(`/api/trajectories/${id}`);
  }

  /** What a run would cost and which frames it would use; starts nothing. */
  estimateAnalysis(id: number, body: StartAnalysis): Observable<RunEstimate> {
    return this.http.post(`/api/trajectories/${id}/analyses/estimate`, body).pipe(map(readEstimate));
  }

  startAnalysis(id: number, body: StartAnalysis): Observable<AnalysisRunDto> {
    return this.http.post(`/api/trajectories/${id}/analyses`, body).pipe(map(readJob));
  }

  runs(trajectoryId: number): Observable<AnalysisRunDto[]> {
    return this.http.get(`/api/trajectories/${trajectoryId}/analyses`).pipe(map(unwrapList('jobs', analysisRunSchema)));
  }

  /** The project's latest runs, newest first, whoever started them. */
  projectRuns(projectId: number): Observable<AnalysisRunDto[]> {
    return this.http.get(`/api/projects/${projectId}/analyses`).pipe(map(unwrapList('jobs', analysisRunSchema)));
  }

  job(id: number): Observable<AnalysisRunDto> {
    return this.http.get(`/api/jobs/${id}`).pipe(map(readJob));
  }

  cancelJob(id: number): Observable<AnalysisRunDto> {
    return this.http.post(`/api/jobs/${id}/cancel`, {}).pipe(map(readJob));
  }

  cutUrl(id: number, from: number, to: number, stride: number): string {
    return `/api/trajectories/${id}/cut?from=${from}&to=${to}&stride=${stride}`;
  }
}
