import { DatePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatTableModule } from '@angular/material/table';
import { MatDialog } from '@angular/material/dialog';
import { firstValueFrom } from 'rxjs';
import { apiErrorMessage } from '../core/api-error';
import { AuthState } from '../core/auth-state';
import { adminUserSchema, type AdminUser } from '../../../shared/admin';
import { unwrapList } from '../core/api-envelope';
import { AdminApi } from './admin-api';
import { confirmed } from '../shell/confirm-dialog';

@Component({
  selector: 'erg-users-page',
  imports: [DatePipe, MatButtonModule, MatProgressSpinnerModule, MatTableModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1>Users</h1>
      <p class="muted">Site admins manage accounts here. A disabled account is signed out everywhere and its API tokens stop working.</p>
      @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
      @if (users.isLoading() && !users.hasValue()) {
        <div class="state"><mat-spinner diameter="28" aria-label="Loading users" /></div>
      } @else if (users.error()) {
        <p class="form-error" role="alert">{{ loadError() }}</p>
      } @else {
        <table mat-table class="cards-on-phone" [dataSource]="rows()" aria-label="All users">
          <ng-container matColumnDef="name">
            <th mat-header-cell *matHeaderCellDef>Name</th>
            <td mat-cell *matCellDef="let u">{{ u.displayName }}<br><span class="muted">{{ u.email }}</span></td>
          </ng-container>
          <ng-container matColumnDef="role">
            <th mat-header-cell *matHeaderCellDef>Site role</th>
            <td mat-cell *matCellDef="let u" data-label="Site role">{{ u.role === 'admin' ? 'Admin' : 'Member' }}</td>
          </ng-container>
          <ng-container matColumnDef="status">
            <th mat-header-cell *matHeaderCellDef>Status</th>
            <td mat-cell *matCellDef="let u" data-label="Status">{{ u.disabled ? 'Disabled' : 'Active' }}</td>
          </ng-container>
          <ng-container matColumnDef="created">
            <th mat-header-cell *matHeaderCellDef>Joined</th>
            <td mat-cell *matCellDef="let u" data-label="Joined">{{ u.createdAt | date: 'mediumDate' }}</td>
          </ng-container>
          <ng-container matColumnDef="actions">
            <th mat-header-cell *matHeaderCellDef><span class="visually-hidden">Actions</span></th>
            <td mat-cell *matCellDef="let u">
              @if (u.id !== me()) {
                <button mat-button type="button" (click)="update(u, { role: u.role === 'admin' ? 'member' : 'admin' })"
                  [attr.aria-label]="(u.role === 'admin' ? 'Remove admin rights from ' : 'Make admin: ') + u.displayName">
                  {{ u.role === 'admin' ? 'Remove admin' : 'Make admin' }}
                </button>
                <button mat-button type="button" (click)="update(u, { disabled: !u.disabled })"
                  [attr.aria-label]="(u.disabled ? 'Enable ' : 'Disable ') + u.displayName">
                  {{ u.disabled ? 'Enable' : 'Disable' }}
                </button>
              } @else {
                <span class="muted">You</span>
              }
            </td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let row; columns: columns" [class.disabled]="row.disabled"></tr>
        </table>
      }
    </section>
  `,
  styles: `.disabled td { color: var(--mat-sys-on-surface-variant); }`,
})
export default class UsersPage {
  private readonly api = inject(AdminApi);
  private readonly dialog = inject(MatDialog);
  private readonly auth = inject(AuthState);

  protected readonly users = httpResource(() => '/api/admin/users', { parse: unwrapList('users', adminUserSchema) });
  protected readonly rows = computed(() => this.users.value() ?? []);
  protected readonly me = computed(() => this.auth.user()?.id);
  protected readonly columns = ['name', 'role', 'status', 'created', 'actions'];
  protected readonly error = signal('');

  protected loadError(): string {
    return apiErrorMessage(this.users.error(), 'The users could not be loaded.');
  }

  protected async update(user: AdminUser, changes: { role?: 'admin' | 'member'; disabled?: boolean }): Promise<void> {
    this.error.set('');
    const question = changes.disabled === true
      ? { title: `Disable ${user.displayName}?`, message: `${user.displayName} is signed out everywhere at once and their API tokens stop working, until an admin enables the account again.`, confirm: 'Disable account' }
      : changes.role === 'admin'
        ? { title: `Make ${user.displayName} a site admin?`, message: `${user.displayName} will manage every account on this site: disable people, enable them, and make or unmake admins.`, confirm: 'Make admin', tone: 'plain' as const }
        : null;
    if (question && !(await confirmed(this.dialog, { ...question, cancel: 'Cancel' }))) return;
    try {
      await firstValueFrom(this.api.updateUser(user.id, changes));
      this.users.reload();
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    }
  }
}
