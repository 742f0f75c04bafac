import { DatePipe } from '@angular/common';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatIconModule } from '@angular/material/icon';
import { apiErrorMessage } from '../core/api-error';
import { sentMailSchema } from '../../../shared/admin';
import { unwrapList } from '../core/api-envelope';
import { mailTextSegments } from './mail-text-segments';

/** What the local SMTP fake received, so e-mail flows can be clicked through without a mail server. */
@Component({
  selector: 'erg-dev-mail-page',
  imports: [DatePipe, MatButtonModule, MatExpansionModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <header class="heading">
        <h1>Sent mail</h1>
        <button mat-stroked-button type="button" (click)="mail.reload()"><mat-icon aria-hidden="true">refresh</mat-icon> Refresh</button>
      </header>
      <p class="muted">Only on development instances: messages the local mail catcher kept instead of delivering, newest first.</p>
      @if (mail.error()) {
        <p class="form-error" role="alert">{{ loadError() }}</p>
      } @else if (messages().length === 0) {
        <p class="state" role="status">{{ mail.isLoading() ? 'Loading…' : 'No mail sent yet.' }}</p>
      } @else {
        <mat-accordion>
          @for (m of messages(); track m.id) {
            <mat-expansion-panel>
              <mat-expansion-panel-header>
                <mat-panel-title>{{ m.subject }}</mat-panel-title>
                <mat-panel-description>to {{ m.to }} · {{ m.date | date: 'medium' }}</mat-panel-description>
              </mat-expansion-panel-header>
              <pre>@for (part of segments(m.text); track $index) {@if (part.href) {<a [href]="part.href">{{ part.text }}</a>} @else {{{ part.text }}}}</pre>
            </mat-expansion-panel>
          }
        </mat-accordion>
      }
    </section>
  `,
  styles: `
    .heading { display: flex; align-items: center; justify-content: space-between; gap: 8px; flex-wrap: wrap; }
    /* A header grows with its subject instead of a fixed height, so wrapped subjects never run into the next row. */
    mat-accordion { --mat-expansion-header-collapsed-state-height: auto; --mat-expansion-header-expanded-state-height: auto; }
    mat-expansion-panel-header { padding-block: 12px; }
    mat-expansion-panel-header ::ng-deep .mat-content { flex-wrap: wrap; gap: 4px 16px; }
    mat-panel-title { flex: 1 1 280px; overflow-wrap: anywhere; }
    mat-panel-description { flex: 1 1 240px; margin-right: 0; overflow-wrap: anywhere; }
    pre { white-space: pre-wrap; word-break: break-word; font-family: inherit; }
  `,
})
export default class DevMailPage {
  protected readonly mail = httpResource(() => '/api/admin/mail', { parse: unwrapList('messages', sentMailSchema) });
  protected readonly messages = computed(() => this.mail.value() ?? []);
  protected readonly segments = mailTextSegments;

  protected loadError(): string {
    return apiErrorMessage(this.mail.error(), 'The sent mail could not be read.');
  }
}
