import { TitleCasePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RouterLink } from '@angular/router';
import { apiErrorMessage } from '../core/api-error';
import { ProjectReports } from '../reports/project-reports';
import { ProjectSeries } from '../series/project-series';
import { ProjectTrajectories } from '../trajectories/project-trajectories';
import { projectSchema } from '../../../shared/projects';
import { unwrap } from '../core/api-envelope';
import { formatBytes } from '../../../shared/byte-size';

/**
 * A project's home: its header, then its trajectories (upload, table,
 * analyses in progress), its series and its reports.
 */
@Component({
  selector: 'erg-project-page',
  imports: [TitleCasePipe, RouterLink, MatButtonModule, MatIconModule, MatProgressSpinnerModule, ProjectTrajectories, ProjectSeries, ProjectReports],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      @if (project.isLoading() && !project.hasValue()) {
        <div class="state"><mat-spinner diameter="28" aria-label="Loading project" /></div>
      } @else if (project.error()) {
        <div class="state" role="alert">
          <mat-icon aria-hidden="true">error</mat-icon><span>{{ loadError() }}</span>
          <a mat-button routerLink="/projects">Back to projects</a>
        </div>
      } @else if (summary(); as p) {
        <header class="project-header">
          <div>
            <h1>{{ p.name }}</h1>
            @if (p.description) { <p class="description">{{ p.description }}</p> }
            <p class="muted">You are {{ p.role === 'editor' ? 'an' : 'a' }} <strong>{{ p.role | titlecase }}</strong> · {{ p.memberCount }} member{{ p.memberCount === 1 ? '' : 's' }} · {{ storageText(p.storageBytes) }} stored</p>
          </div>
          @if (canEditSettings()) {
            <a mat-stroked-button [routerLink]="['/projects', p.id, 'settings']"><mat-icon aria-hidden="true">tune</mat-icon> Settings</a>
          }
        </header>
        <section class="project-trajectories" aria-labelledby="trajectories-heading">
          <h2 id="trajectories-heading">Trajectories</h2>
          <erg-project-trajectories [projectId]="p.id" [canEdit]="canEditSettings()" />
        </section>
        <erg-project-series [projectId]="p.id" />
        <erg-project-reports [projectId]="p.id" />
      }
    </section>
  `,
  styles: `
    .project-header { display: flex; justify-content: space-between; align-items: flex-start; gap: 16px; flex-wrap: wrap; }
    .description { max-width: 70ch; white-space: pre-line; }
  `,
})
export default class ProjectPage {
  /** The :id route parameter. */
  readonly id = input.required<string>();

  protected readonly project = httpResource(() => `/api/projects/${encodeURIComponent(this.id())}`, { parse: unwrap('project', projectSchema) });
  protected readonly summary = computed(() => this.project.value() ?? null);
  protected readonly canEditSettings = computed(() => {
    const role = this.summary()?.role;
    return role === 'owner' || role === 'editor';
  });

  /** Uploads and the binary frame copies inspection keeps of them. */
  protected storageText(bytes: number): string {
    return formatBytes(bytes);
  }

  protected loadError(): string {
    return apiErrorMessage(this.project.error(), 'This project could not be loaded.');
  }
}
