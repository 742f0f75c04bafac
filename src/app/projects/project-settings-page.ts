import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RouterLink } from '@angular/router';
import { apiErrorMessage } from '../core/api-error';
import { AuditPanel } from './audit-panel';
import { DeleteProjectPanel } from './delete-project-panel';
import { InvitationsPanel } from './invitations-panel';
import { MembersPanel } from './members-panel';
import { ProjectDetailsForm } from './project-details-form';
import { ProjectModelPanel } from '../interaction-model/project-model-panel';
import { projectSchema } from '../../../shared/projects';
import { unwrap } from '../core/api-envelope';

@Component({
  selector: 'erg-project-settings-page',
  imports: [RouterLink, MatButtonModule, MatCardModule, MatIconModule, MatProgressSpinnerModule,
    AuditPanel, DeleteProjectPanel, InvitationsPanel, MembersPanel, ProjectDetailsForm, ProjectModelPanel],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      @if (project.isLoading() && !project.hasValue()) {
        <div class="state"><mat-spinner diameter="28" aria-label="Loading project" /></div>
      } @else if (project.error()) {
        <div class="state" role="alert"><mat-icon aria-hidden="true">error</mat-icon><span>{{ loadError() }}</span></div>
      } @else if (summary(); as p) {
        <a mat-button [routerLink]="['/projects', p.id]"><mat-icon aria-hidden="true">arrow_back</mat-icon> {{ p.name }}</a>
        <h1>Settings</h1>
        @if (p.role === 'viewer') {
          <p role="status">Viewers read reports and comment; settings are for the project's editors and owners.</p>
        } @else {
          <mat-card appearance="outlined">
            <mat-card-header><h2 mat-card-title>Name and description</h2></mat-card-header>
            <mat-card-content><erg-project-details-form [project]="p" (changed)="project.reload(); logChanged()" /></mat-card-content>
          </mat-card>
          <mat-card appearance="outlined">
            <mat-card-header><h2 mat-card-title>Interaction model</h2></mat-card-header>
            <mat-card-content><erg-project-model-panel [projectId]="p.id" [projectName]="p.name" /></mat-card-content>
          </mat-card>
          <mat-card appearance="outlined">
            <mat-card-header><h2 mat-card-title>Members</h2></mat-card-header>
            <mat-card-content><erg-members-panel [projectId]="p.id" [canManage]="isOwner()" (changed)="logChanged()" /></mat-card-content>
          </mat-card>
          @if (isOwner()) {
            <mat-card appearance="outlined">
              <mat-card-header><h2 mat-card-title>Invite by e-mail</h2></mat-card-header>
              <mat-card-content><erg-invitations-panel [projectId]="p.id" (changed)="logChanged()" /></mat-card-content>
            </mat-card>
            <mat-card appearance="outlined">
              <mat-card-header><h2 mat-card-title>Audit log</h2></mat-card-header>
              <mat-card-content><erg-audit-panel [projectId]="p.id" [revision]="auditRevision()" /></mat-card-content>
            </mat-card>
            <mat-card appearance="outlined" class="danger-zone">
              <mat-card-header><h2 mat-card-title>Delete project</h2></mat-card-header>
              <mat-card-content><erg-delete-project-panel [project]="p" /></mat-card-content>
            </mat-card>
          }
        }
      }
    </section>
  `,
  styles: `
    mat-card { margin-bottom: 20px; }
    .danger-zone { border-color: var(--mat-sys-error); }
  `,
})
export default class ProjectSettingsPage {
  /** The :id route parameter. */
  readonly id = input.required<string>();

  protected readonly project = httpResource(() => `/api/projects/${encodeURIComponent(this.id())}`, { parse: unwrap('project', projectSchema) });
  protected readonly summary = computed(() => this.project.value() ?? null);
  protected readonly isOwner = computed(() => this.summary()?.role === 'owner');

  /** Counts changes made on this page; the audit log reloads on each. */
  protected readonly auditRevision = signal(0);

  protected logChanged(): void {
    this.auditRevision.update((n) => n + 1);
  }

  protected loadError(): string {
    return apiErrorMessage(this.project.error(), 'This project could not be loaded.');
  }
}
