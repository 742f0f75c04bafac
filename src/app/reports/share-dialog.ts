import { Clipboard } from '@angular/cdk/clipboard';
import { TitleCasePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { firstValueFrom } from 'rxjs';
import { ACCESS_LINK_MAX_DAYS } from '../../../shared/account-rules';
import { apiErrorMessage } from '../core/api-error';
import { memberSchema } from '../../../shared/projects';
import { AccessLinksList } from './access-links-list';
import type { LinkRow } from './link-state';
import { ReportsApi, type NewLink } from './reports-api';
import { targetNoun, targetPath, type ShareTarget } from './share-target';
import { accessLinkSchema } from '../../../shared/sharing';
import { unwrapList } from '../core/api-envelope';

export interface ShareDialogData {
  target: ShareTarget;
  projectId: number;
  title: string;
}

/** The list rows of a report's or a series' links: the same fields, keyed to either. */
const linkRowSchema = accessLinkSchema.omit({ reportId: true });

/** Who can read this report or series already, and read-only links for anyone else. */
@Component({
  selector: 'erg-share-dialog',
  imports: [TitleCasePipe, ReactiveFormsModule, AccessLinksList, MatButtonModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Share “{{ data.title }}”</h2>
    <mat-dialog-content>
      <section aria-labelledby="share-members">
        <h3 id="share-members">Project members</h3>
        <p class="muted">Everyone in the project can read this {{ noun }} and comment on it.</p>
        @if (members.isLoading() && !members.hasValue()) {
          <mat-spinner diameter="22" aria-label="Loading members" />
        } @else if (members.error()) {
          <p class="form-error" role="alert">{{ error(members.error(), 'The members could not be loaded.') }}</p>
        } @else {
          <ul class="members" aria-label="Project members">
            @for (m of memberList(); track m.userId) {
              <li><span>{{ m.displayName }}</span><span class="muted">{{ m.email }} · {{ m.role | titlecase }}</span></li>
            }
          </ul>
        }
      </section>

      <section aria-labelledby="share-links">
        <h3 id="share-links">Access links</h3>
        <p class="muted">Anyone with a link can read this {{ noun }} without signing in — read only, until it expires or you revoke it. They cannot see comments or anything else in the project.</p>
        <form class="new-link" (submit)="$event.preventDefault(); createLink()">
          <mat-form-field appearance="outline" class="days">
            <mat-label>Expires after (days)</mat-label>
            <input matInput type="number" min="1" [max]="maxDays" [formControl]="days" required />
            <mat-hint>1 to {{ maxDays }} days</mat-hint>
          </mat-form-field>
          <button mat-flat-button type="submit" [disabled]="days.invalid || creating()">Create link</button>
        </form>
        @if (createError()) {
          <p class="form-error" role="alert">{{ createError() }}</p>
        }
        @if (created(); as link) {
          <div class="created" role="status">
            <mat-form-field appearance="outline" class="url">
              <mat-label>New access link</mat-label>
              <input matInput readonly [value]="link.url" (focus)="selectAll($event)" />
              <mat-hint>Copy it now: it is shown only this once.</mat-hint>
            </mat-form-field>
            <button mat-stroked-button type="button" (click)="copy(link.url)"><mat-icon aria-hidden="true">content_copy</mat-icon> {{ copied() ? 'Copied' : 'Copy link' }}</button>
          </div>
        }
        @if (links.error()) {
          <p class="form-error" role="alert">{{ error(links.error(), 'The access links could not be loaded.') }}</p>
        } @else if (links.hasValue()) {
          <erg-access-links-list [links]="linkList()" [busyId]="revoking()" (revoke)="revoke($event)" />
        }
        @if (revokeError()) {
          <p class="form-error" role="alert">{{ revokeError() }}</p>
        }
      </section>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>Done</button>
    </mat-dialog-actions>
  `,
  styles: `
    section + section { margin-top: 20px; }
    h3 { margin: 0 0 4px; }
    .muted { margin: 0 0 8px; }
    .members { list-style: none; margin: 0; padding: 0; display: flex; flex-direction: column; gap: 4px; }
    .members li { display: flex; gap: 8px; flex-wrap: wrap; }
    .members .muted { margin: 0; }
    .new-link, .created { display: flex; gap: 12px; align-items: baseline; flex-wrap: wrap; }
    .created { margin: 16px 0 8px; }
    .days { width: 200px; }
    .url { flex: 1; min-width: 280px; }
  `,
})
export class ShareDialog {
  protected readonly data = inject<ShareDialogData>(MAT_DIALOG_DATA);
  private readonly api = inject(ReportsApi);
  private readonly clipboard = inject(Clipboard);

  protected readonly maxDays = ACCESS_LINK_MAX_DAYS;
  protected readonly noun = targetNoun(this.data.target);
  protected readonly members = httpResource(() => `/api/projects/${this.data.projectId}/members`, { parse: unwrapList('members', memberSchema) });
  protected readonly links = httpResource(() => `${targetPath(this.data.target)}/access-links`, { parse: unwrapList('links', linkRowSchema) });
  protected readonly memberList = computed(() => this.members.value() ?? []);
  protected readonly linkList = computed(() => this.links.value() ?? []);
  protected readonly days = new FormControl(7, { nonNullable: true, validators: [Validators.required, Validators.min(1), Validators.max(ACCESS_LINK_MAX_DAYS)] });
  protected readonly creating = signal(false);
  protected readonly created = signal<NewLink | null>(null);
  protected readonly copied = signal(false);
  protected readonly createError = signal<string | null>(null);
  protected readonly revoking = signal<number | null>(null);
  protected readonly revokeError = signal<string | null>(null);

  protected error(err: unknown, fallback: string): string {
    return apiErrorMessage(err, fallback);
  }

  protected async createLink(): Promise<void> {
    if (this.days.invalid) return;
    this.creating.set(true);
    this.createError.set(null);
    this.copied.set(false);
    try {
      this.created.set(await firstValueFrom(this.api.createLink(this.data.target, Math.round(this.days.value))));
      this.links.reload();
    } catch (err) {
      this.createError.set(apiErrorMessage(err, 'The link could not be created.'));
    } finally {
      this.creating.set(false);
    }
  }

  protected selectAll(event: FocusEvent): void {
    if (event.target instanceof HTMLInputElement) event.target.select();
  }

  protected copy(url: string): void {
    this.copied.set(this.clipboard.copy(url));
  }

  protected async revoke(link: LinkRow): Promise<void> {
    this.revoking.set(link.id);
    this.revokeError.set(null);
    try {
      await firstValueFrom(this.api.revokeLink(this.data.target, link.id));
      // A revoked link no longer works: stop offering it for copying.
      if (this.created()?.id === link.id) {
        this.created.set(null);
        this.copied.set(false);
      }
      this.links.reload();
    } catch (err) {
      this.revokeError.set(apiErrorMessage(err, 'The link could not be revoked.'));
    } finally {
      this.revoking.set(null);
    }
  }
}
