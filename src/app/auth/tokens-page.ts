import { Clipboard } from '@angular/cdk/clipboard';
import { DatePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal, viewChild } from '@angular/core';
import { FormBuilder, FormGroupDirective, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { firstValueFrom } from 'rxjs';
import { apiErrorMessage } from '../core/api-error';
import { apiTokenSchema, type ApiToken, type NewApiToken } from '../../../shared/accounts';
import { unwrapList } from '../core/api-envelope';
import { confirmed } from '../shell/confirm-dialog';
import { tokenState, TokensApi } from './tokens-api';

@Component({
  selector: 'erg-tokens-page',
  imports: [DatePipe, ReactiveFormsModule, MatButtonModule, MatCardModule, MatFormFieldModule, MatIconModule, MatInputModule,
    MatProgressSpinnerModule, MatSelectModule, MatTableModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1>API tokens</h1>
      <p class="muted">A token lets a script act as you: send it as <code>Authorization: Bearer &lt;token&gt;</code>. Revoke it when the script no longer needs it.
        Tokens are made and revoked only here, signed in; a password reset or a disabled account revokes them all.</p>

      <form class="create" [formGroup]="form" (ngSubmit)="create()" novalidate>
        <mat-form-field>
          <mat-label>Token name</mat-label>
          <input matInput formControlName="name" required maxlength="120">
          <mat-hint>Where it will be used, e.g. "cluster upload script".</mat-hint>
          @if (form.controls.name.hasError('required')) { <mat-error>Give the token a name.</mat-error> }
        </mat-form-field>
        <mat-form-field class="expiry">
          <mat-label>Expires</mat-label>
          <mat-select formControlName="expiresInDays">
            @for (choice of expiryChoices; track choice.days) { <mat-option [value]="choice.days">{{ choice.label }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <button mat-flat-button type="submit" [disabled]="busy()">Create token</button>
      </form>
      @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }

      @if (created(); as fresh) {
        <mat-card appearance="outlined" class="fresh" role="status">
          <mat-card-content>
            <p><strong>Copy your new token now.</strong> It will not be shown again.</p>
            <div class="secret">
              <code aria-label="New API token">{{ fresh.token }}</code>
              <button mat-stroked-button type="button" (click)="copy(fresh.token)">
                <mat-icon aria-hidden="true">content_copy</mat-icon> {{ copied() ? 'Copied' : 'Copy' }}
              </button>
            </div>
          </mat-card-content>
        </mat-card>
      }

      <h2>Your tokens</h2>
      @if (tokens.isLoading()) {
        <div class="state"><mat-spinner diameter="24" aria-label="Loading tokens" /></div>
      } @else if (tokens.error()) {
        <p class="form-error" role="alert">{{ loadError() }}</p>
      } @else if (!tokens.value()?.length) {
        <p class="state" role="status">No tokens yet.</p>
      } @else {
        <table mat-table class="cards-on-phone" [dataSource]="tokens.value()!" aria-label="Your API tokens">
          <ng-container matColumnDef="name"><th mat-header-cell *matHeaderCellDef>Name</th><td mat-cell *matCellDef="let t">{{ t.name }}</td></ng-container>
          <ng-container matColumnDef="prefix"><th mat-header-cell *matHeaderCellDef>Starts with</th><td mat-cell *matCellDef="let t" data-label="Starts with"><code>{{ t.prefix }}…</code></td></ng-container>
          <ng-container matColumnDef="created"><th mat-header-cell *matHeaderCellDef>Created</th><td mat-cell *matCellDef="let t" data-label="Created">{{ t.createdAt | date: 'medium' }}</td></ng-container>
          <ng-container matColumnDef="used"><th mat-header-cell *matHeaderCellDef>Last used</th><td mat-cell *matCellDef="let t" data-label="Last used">{{ t.lastUsedAt ? (t.lastUsedAt | date: 'medium') : 'Never' }}</td></ng-container>
          <ng-container matColumnDef="expires"><th mat-header-cell *matHeaderCellDef>Expires</th><td mat-cell *matCellDef="let t" data-label="Expires">{{ t.expiresAt ? (t.expiresAt | date: 'mediumDate') : 'Never' }}</td></ng-container>
          <ng-container matColumnDef="state"><th mat-header-cell *matHeaderCellDef>State</th><td mat-cell *matCellDef="let t" data-label="State" [class.stopped]="!stateOf(t).active">{{ stateOf(t).label }}</td></ng-container>
          <ng-container matColumnDef="actions">
            <th mat-header-cell *matHeaderCellDef><span class="visually-hidden">Actions</span></th>
            <td mat-cell *matCellDef="let t">
              @if (stateOf(t).active) { <button mat-button type="button" (click)="revoke(t)" [attr.aria-label]="'Revoke token ' + t.name">Revoke</button> }
            </td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let row; columns: columns"></tr>
        </table>
      }
    </section>
  `,
  styles: `
    .create { display: flex; gap: 12px; align-items: baseline; flex-wrap: wrap; }
    .create mat-form-field { flex: 1; min-width: 240px; }
    .create mat-form-field.expiry { flex: 0 1 180px; min-width: 150px; }
    td.stopped { color: var(--mat-sys-on-surface-variant); font-style: italic; }
    .fresh { margin: 16px 0; background: var(--mat-sys-tertiary-container); }
    .secret { display: flex; gap: 12px; align-items: center; flex-wrap: wrap; }
    .secret code { word-break: break-all; font-size: 0.95rem; }
  `,
})
export default class TokensPage {
  private readonly api = inject(TokensApi);
  private readonly clipboard = inject(Clipboard);
  private readonly dialog = inject(MatDialog);

  protected readonly tokens = httpResource(() => '/api/tokens', { parse: unwrapList('tokens', apiTokenSchema) });
  protected readonly columns = ['name', 'prefix', 'created', 'used', 'expires', 'state', 'actions'];
  protected readonly expiryChoices = [
    { days: 0, label: 'Never' }, { days: 30, label: 'In 30 days' }, { days: 90, label: 'In 90 days' }, { days: 365, label: 'In a year' },
  ];
  protected readonly stateOf = tokenState;
  private readonly formDirective = viewChild.required(FormGroupDirective);
  protected readonly busy = signal(false);
  protected readonly error = signal('');
  protected readonly created = signal<NewApiToken | null>(null);
  protected readonly copied = signal(false);
  protected readonly form = inject(FormBuilder).nonNullable.group({
    name: ['', [Validators.required, Validators.maxLength(120)]],
    expiresInDays: [0],
  });

  protected loadError(): string {
    return apiErrorMessage(this.tokens.error(), 'Your tokens could not be loaded.');
  }

  protected async create(): Promise<void> {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set('');
    try {
      const { name, expiresInDays } = this.form.getRawValue();
      this.created.set(await firstValueFrom(this.api.create(name, expiresInDays || null)));
      this.copied.set(false);
      // Resetting through the directive also clears "submitted", so the empty field shows no error.
      this.formDirective().resetForm({ name: '', expiresInDays: 0 });
      this.tokens.reload();
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    } finally {
      this.busy.set(false);
    }
  }

  protected copy(token: string): void {
    this.copied.set(this.clipboard.copy(token));
  }

  protected async revoke(token: ApiToken): Promise<void> {
    this.error.set('');
    const sure = await confirmed(this.dialog, {
      title: `Revoke token “${token.name}”?`,
      message: 'Scripts that send it are refused from now on. A revoked token cannot be brought back; make a new one if a script needs access again.',
      confirm: 'Revoke token',
    });
    if (!sure) return;
    try {
      await firstValueFrom(this.api.revoke(token.id));
      if (this.created()?.id === token.id) this.created.set(null);
      this.tokens.reload();
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    }
  }
}
