import { DatePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { firstValueFrom } from 'rxjs';
import { COMMENT_MAX_LENGTH } from '../../../shared/account-rules';
import { apiErrorMessage } from '../core/api-error';
import { ReportsApi } from './reports-api';
import { targetPath, type ShareTarget } from './share-target';
import { commentSchema } from '../../../shared/sharing';
import { unwrapList } from '../core/api-envelope';

/** Members' discussion of a report or a series: read in order, add one. */
@Component({
  selector: 'erg-comments-panel',
  imports: [DatePipe, ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="comments" aria-labelledby="comments-heading">
      <h2 id="comments-heading">Comments</h2>
      @if (comments.isLoading() && !comments.hasValue()) {
        <div class="state"><mat-spinner diameter="24" aria-label="Loading comments" /></div>
      } @else if (comments.error()) {
        <div class="state" role="alert">
          <mat-icon aria-hidden="true">error</mat-icon>
          <span>{{ loadError() }}</span>
          <button mat-button type="button" (click)="comments.reload()">Try again</button>
        </div>
      } @else if (list().length === 0) {
        <p class="muted" role="status">No comments yet. Ask about a fit window or note a check you made; every member of the project reads it.</p>
      } @else {
        <ol class="list" aria-label="Comments, oldest first">
          @for (c of list(); track c.id) {
            <li>
              <p class="meta"><strong>{{ c.author.displayName }}</strong> · <time [attr.datetime]="c.createdAt">{{ c.createdAt | date: 'medium' }}</time></p>
              <p class="body">{{ c.body }}</p>
            </li>
          }
        </ol>
      }
      <form (submit)="$event.preventDefault(); post()" class="add">
        <mat-form-field appearance="outline" class="field">
          <mat-label>Add a comment</mat-label>
          <textarea matInput [formControl]="draft" rows="3" [maxlength]="maxLength"></textarea>
          <mat-hint align="end">{{ draft.value.length }} / {{ maxLength }}</mat-hint>
        </mat-form-field>
        @if (postError()) {
          <p class="form-error" role="alert">{{ postError() }}</p>
        }
        <button mat-flat-button type="submit" [disabled]="posting() || draft.invalid">Post comment</button>
      </form>
    </section>
  `,
  styles: `
    .comments { padding: 16px 20px; border-radius: 16px; border: 1px solid var(--mat-sys-outline-variant); }
    h2 { margin: 0 0 8px; }
    .list { list-style: none; margin: 0 0 16px; padding: 0; display: flex; flex-direction: column; gap: 12px; }
    .list li { padding: 10px 14px; border-radius: 12px; background: var(--mat-sys-surface-container); }
    .meta { margin: 0; font: var(--mat-sys-label-medium); color: var(--mat-sys-on-surface-variant); }
    .body { margin: 4px 0 0; white-space: pre-wrap; overflow-wrap: anywhere; }
    .add { display: flex; flex-direction: column; align-items: flex-start; gap: 4px; }
    .field { width: 100%; max-width: 720px; }
  `,
})
export class CommentsPanel {
  private readonly api = inject(ReportsApi);
  readonly target = input.required<ShareTarget>();

  protected readonly maxLength = COMMENT_MAX_LENGTH;
  protected readonly comments = httpResource(() => `${targetPath(this.target())}/comments`, { parse: unwrapList('comments', commentSchema) });
  protected readonly list = computed(() => this.comments.value() ?? []);
  protected readonly draft = new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.pattern(/\S/)] });
  protected readonly posting = signal(false);
  protected readonly postError = signal<string | null>(null);

  protected loadError(): string {
    return apiErrorMessage(this.comments.error(), 'The comments could not be loaded.');
  }

  protected async post(): Promise<void> {
    if (this.draft.invalid || this.posting()) return;
    this.posting.set(true);
    this.postError.set(null);
    try {
      await firstValueFrom(this.api.addComment(this.target(), this.draft.value.trim()));
      this.draft.reset('');
      this.comments.reload();
    } catch (err) {
      this.postError.set(apiErrorMessage(err, 'The comment could not be posted.'));
    } finally {
      this.posting.set(false);
    }
  }
}
