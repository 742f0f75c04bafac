import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { HeadlineCard } from './headline-cards';

/** The report's headline numbers as a row of cards. */
@Component({
  selector: 'erg-headline-card-grid',
  imports: [MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (cards().length === 0) {
      <p class="muted" role="status">No headline numbers: none of the analyses in this report produces one.</p>
    }
    <ul class="cards" aria-label="Headline results">
      @for (card of cards(); track card.id) {
        <li class="card" [class.warn]="card.warning" [attr.data-card]="card.id">
          <h3>{{ card.title }}</h3>
          @if (card.rows) {
            @if (card.unit) { <p class="row-unit">in {{ card.unit }}</p> }
            <dl class="rows">
              @for (row of card.rows; track row.label) {
                <div class="row"><dt>{{ row.label }}</dt><dd><span class="row-number">{{ row.value }}</span><span class="row-note">{{ row.note }}</span></dd></div>
              }
            </dl>
          } @else {
            <p class="value"><span class="number">{{ card.value }}</span> @if (card.unit) { <span class="unit">{{ card.unit }}</span> }</p>
          }
          <p class="detail">{{ card.detail }}</p>
          @if (card.warning) {
            <p class="warning"><mat-icon aria-hidden="true">warning</mat-icon> {{ card.warning }}</p>
          }
        </li>
      }
    </ul>
  `,
  styles: `
    .cards { list-style: none; margin: 0; padding: 0; display: grid; grid-template-columns: repeat(auto-fill, minmax(240px, 1fr)); gap: 12px; }
    .card { padding: 14px 16px; border-radius: 16px; background: var(--mat-sys-surface-container-low); border-left: 4px solid var(--mat-sys-primary); }
    .card.warn { border-left-color: var(--mat-sys-tertiary); }
    h3 { margin: 0 0 6px; font: var(--mat-sys-label-large); color: var(--mat-sys-on-surface-variant); }
    .value { margin: 0; display: flex; align-items: baseline; flex-wrap: wrap; gap: 6px; }
    .number { font: var(--mat-sys-headline-small); font-variant-numeric: tabular-nums; color: var(--mat-sys-on-surface); }
    .unit { font: var(--mat-sys-body-large); color: var(--mat-sys-on-surface-variant); }
    .row-unit { margin: 0 0 4px; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
    .rows { margin: 0; display: grid; gap: 4px; }
    .row { display: grid; grid-template-columns: minmax(3.5em, auto) 1fr; column-gap: 10px; align-items: baseline; }
    dt { font: var(--mat-sys-title-small); color: var(--mat-sys-on-surface); overflow-wrap: anywhere; }
    dd { margin: 0; display: flex; flex-wrap: wrap; column-gap: 8px; align-items: baseline; }
    .row-number { font: var(--mat-sys-title-medium); font-variant-numeric: tabular-nums; color: var(--mat-sys-on-surface); }
    .row-note { font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
    .detail { margin: 6px 0 0; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
    .warning { display: flex; gap: 6px; align-items: flex-start; margin: 8px 0 0; font: var(--mat-sys-body-small); color: var(--mat-sys-tertiary); }
    .warning mat-icon { font-size: 18px; width: 18px; height: 18px; flex: none; }
  `,
})
export class HeadlineCardGrid {
  readonly cards = input.required<HeadlineCard[]>();
}
