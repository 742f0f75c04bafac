import { DatePipe, TitleCasePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { firstValueFrom } from 'rxjs';
import { apiErrorMessage } from '../core/api-error';
import { memberSchema, PROJECT_ROLES, type Member, type ProjectRole } from '../../../shared/projects';
import { unwrapList } from '../core/api-envelope';
import { ROLE_MEANING } from './role-meaning';
import { ProjectsApi } from './projects-api';

/** Who is in the project; owners change roles and remove people here. */
@Component({
  selector: 'erg-members-panel',
  imports: [DatePipe, TitleCasePipe, MatButtonModule, MatProgressSpinnerModule, MatSelectModule, MatTableModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
    @if (members.isLoading() && !members.hasValue()) {
      <div class="state"><mat-spinner diameter="24" aria-label="Loading members" /></div>
    } @else if (members.error()) {
      <p class="form-error" role="alert">{{ loadError() }}</p>
    } @else {
      <table mat-table [dataSource]="rows()" aria-label="Project members">
        <ng-container matColumnDef="name">
          <th mat-header-cell *matHeaderCellDef>Name</th>
          <td mat-cell *matCellDef="let m">{{ m.displayName }}<br><span class="muted">{{ m.email }}</span></td>
        </ng-container>
        <ng-container matColumnDef="role">
          <th mat-header-cell *matHeaderCellDef>Role</th>
          <td mat-cell *matCellDef="let m">
            @if (canManage()) {
              <mat-select [value]="m.role" (selectionChange)="changeRole(m, $event.value)" [attr.aria-label]="'Role of ' + m.displayName">
                @for (role of roles; track role) { <mat-option [value]="role" [title]="meaning[role]">{{ role | titlecase }}</mat-option> }
              </mat-select>
            } @else {
              {{ m.role | titlecase }}
            }
          </td>
        </ng-container>
        <ng-container matColumnDef="joined">
          <th mat-header-cell *matHeaderCellDef>Joined</th>
          <td mat-cell *matCellDef="let m">{{ m.joinedAt | date: 'mediumDate' }}</td>
        </ng-container>
        <ng-container matColumnDef="actions">
          <th mat-header-cell *matHeaderCellDef><span class="visually-hidden">Actions</span></th>
          <td mat-cell *matCellDef="let m">
            <button mat-button type="button" (click)="remove(m)" [attr.aria-label]="'Remove ' + m.displayName">Remove</button>
          </td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns()"></tr>
        <tr mat-row *matRowDef="let row; columns: columns()"></tr>
      </table>
    }
  `,
  styles: `mat-select { max-width: 140px; }`,
})
export class MembersPanel {
  private readonly api = inject(ProjectsApi);

  readonly projectId = input.required<number>();
  /** Owners may change roles and remove members. */
  readonly canManage = input(false);
  protected readonly roles = PROJECT_ROLES;
  protected readonly meaning = ROLE_MEANING;
  protected readonly members = httpResource(() => `/api/projects/${this.projectId()}/members`, { parse: unwrapList('members', memberSchema) });
  protected readonly rows = computed(() => this.members.value() ?? []);
  protected readonly columns = computed(() => (this.canManage() ? ['name', 'role', 'joined', 'actions'] : ['name', 'role', 'joined']));
  protected readonly error = signal('');

  protected loadError(): string {
    return apiErrorMessage(this.members.error(), 'The members could not be loaded.');
  }

  protected async changeRole(member: Member, role: ProjectRole): Promise<void> {
    this.error.set('');
    try {
      await firstValueFrom(this.api.changeRole(this.projectId(), member.userId, role));
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    }
    // Reloads either way, so a refused change shows the role that still holds.
    this.members.reload();
  }

  protected async remove(member: Member): Promise<void> {
    this.error.set('');
    try {
      await firstValueFrom(this.api.removeMember(this.projectId(), member.userId));
      this.members.reload();
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    }
  }

  /** Lets the page refresh the list after an invitation is accepted elsewhere. */
  reload(): void {
    this.members.reload();
  }
}
