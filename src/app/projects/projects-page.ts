import { DatePipe, TitleCasePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import { apiErrorMessage } from '../core/api-error';
import { CreateProjectDialog } from './create-project-dialog';
import { projectSchema, type ProjectSummary } from '../../../shared/projects';
import { unwrapList } from '../core/api-envelope';

@Component({
  selector: 'erg-projects-page',
  imports: [DatePipe, TitleCasePipe, RouterLink, MatButtonModule, MatIconModule, MatProgressSpinnerModule, MatTableModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <header class="heading">
        <h1>Projects</h1>
        <button mat-flat-button type="button" (click)="openCreateDialog()"><mat-icon aria-hidden="true">add</mat-icon> New project</button>
      </header>
      @if (projects.isLoading() && !projects.hasValue()) {
        <div class="state"><mat-spinner diameter="28" aria-label="Loading projects" /></div>
      } @else if (projects.error()) {
        <div class="state" role="alert">
          <mat-icon aria-hidden="true">error</mat-icon>
          <span>{{ loadError() }}</span>
          <button mat-button type="button" (click)="projects.reload()">Try again</button>
        </div>
      } @else if (rows().length === 0) {
        <div class="state empty" role="status">
          <mat-icon aria-hidden="true">folder_open</mat-icon>
          <p>No projects yet. A project holds a team's trajectories, analyses and reports — create one, or ask a colleague to invite you.</p>
        </div>
      } @else {
        <table mat-table class="cards-on-phone" [dataSource]="rows()" aria-label="Your projects">
          <ng-container matColumnDef="name">
            <th mat-header-cell *matHeaderCellDef>Name</th>
            <td mat-cell *matCellDef="let p"><a [routerLink]="['/projects', p.id]">{{ p.name }}</a></td>
          </ng-container>
          <ng-container matColumnDef="role">
            <th mat-header-cell *matHeaderCellDef>Your role</th>
            <td mat-cell *matCellDef="let p" data-label="Your role">{{ p.role | titlecase }}</td>
          </ng-container>
          <ng-container matColumnDef="members">
            <th mat-header-cell *matHeaderCellDef>Members</th>
            <td mat-cell *matCellDef="let p" data-label="Members">{{ p.memberCount }}</td>
          </ng-container>
          <ng-container matColumnDef="activity">
            <th mat-header-cell *matHeaderCellDef>Last activity</th>
            <td mat-cell *matCellDef="let p" data-label="Last activity">{{ p.lastActivityAt | date: 'medium' }}</td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let row; columns: columns"></tr>
        </table>
      }
    </section>
  `,
  styles: `
    .heading { display: flex; align-items: center; justify-content: space-between; gap: 16px; }
    .empty p { max-width: 60ch; }
    td a { color: var(--mat-sys-primary); font-weight: 500; }
  `,
})
export default class ProjectsPage {
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);

  protected readonly projects = httpResource(() => '/api/projects', { parse: unwrapList('projects', projectSchema) });
  protected readonly rows = computed(() => this.projects.value() ?? []);
  protected readonly columns = ['name', 'role', 'members', 'activity'];

  protected loadError(): string {
    return apiErrorMessage(this.projects.error(), 'Your projects could not be loaded.');
  }

  protected openCreateDialog(): void {
    this.dialog.open<CreateProjectDialog, void, ProjectSummary>(CreateProjectDialog, { width: '480px' })
      .afterClosed().subscribe((project) => {
        if (project) void this.router.navigate(['/projects', project.id]);
      });
  }
}
