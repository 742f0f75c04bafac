import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { SeriesMemberResult, TransitionBracket, TransitionResult } from '../../../shared/series-results';
import { formatNumber } from '../reports/number-format';

/** SCIENCE item 31, said on every bracket even if the server's caution is missing. */
const FALLBACK_CAUTION = 'Heating a perfect crystal overshoots the transition (superheating) and cooling undershoots it (supercooling); a two-phase (coexistence) run brackets it far better.';

const BRANCH_WORDS: Record<TransitionBracket['branch'], string> = { all: 'Whole series', heating: 'Heating branch', cooling: 'Cooling branch' };

/** A melting or vaporization bracket: between which members the phase changes, per branch, with its caution. */
@Component({
  selector: 'erg-transition-card',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="card" [attr.aria-labelledby]="headingId()">
      <h3 [id]="headingId()">{{ title() }}</h3>
      @for (b of brackets(); track b.branch) {
        <div class="bracket">
          <p class="branch">{{ b.branchWords }}</p>
          @if (b.range) {
            <p class="value" [attr.aria-label]="title() + ', ' + b.branchWords">{{ b.range }}</p>
            <p class="ends">{{ b.ends }}</p>
          }
          <p class="muted">{{ b.message }}</p>
          @if (b.overlap) { <p class="warning" role="note">A {{ transition().highPhase }} member lies below a {{ transition().lowPhase }} one: the phases overlap in temperature, so this is a hysteresis or an unclear call, not a sharp bracket.</p> }
        </div>
      } @empty {
        <p class="muted" role="status">No bracket yet: it needs a {{ transition().lowPhase }} member and a {{ transition().highPhase }} member.</p>
      }
      @if (transition().hysteresisBounds; as h) {
        <p class="hysteresis"><strong>Hysteresis loop:</strong> heating and cooling bracket it from both sides, so the transition lies between {{ k(h.lowerK) }} and {{ k(h.upperK) }}. {{ h.message }}</p>
      }
      <p class="caution" role="note">{{ caution() }}</p>
    </section>
  `,
  styleUrl: './result-card.scss',
  styles: `
    .bracket + .bracket { margin-top: 10px; padding-top: 8px; border-top: 1px dashed var(--mat-sys-outline-variant); }
    .branch { margin: 0; font: var(--mat-sys-label-large); color: var(--mat-sys-on-surface-variant); }
    .value { margin: 2px 0 0; font: var(--mat-sys-title-large); font-variant-numeric: tabular-nums; }
    .ends { font: var(--mat-sys-body-small); }
    .hysteresis { margin-top: 10px; }
  `,
})
export class TransitionCard {
  readonly transition = input.required<TransitionResult>();
  readonly members = input.required<SeriesMemberResult[]>();

  protected readonly title = computed(() => (this.transition().kind === 'melting' ? 'Melting bracket' : 'Vaporization bracket'));
  protected readonly headingId = computed(() => `transition-${this.transition().kind}`);
  protected readonly caution = computed(() => this.transition().caution || FALLBACK_CAUTION);
  protected readonly brackets = computed(() => this.transition().brackets.map((b) => ({
    branch: b.branch, branchWords: BRANCH_WORDS[b.branch], message: b.message, overlap: b.overlap,
    range: b.below && b.above ? `${this.k(b.below.temperatureK)} < T < ${this.k(b.above.temperatureK)}` : null,
    ends: b.below && b.above ? `${this.nameOf(b.below.trajectoryId)} is ${this.transition().lowPhase}; ${this.nameOf(b.above.trajectoryId)} is ${this.transition().highPhase}.` : '',
  })));

  protected k(t: number): string {
    return `${formatNumber(t, 4)} K`;
  }

  private nameOf(trajectoryId: number): string {
    return this.members().find((m) => m.trajectoryId === trajectoryId)?.name ?? `trajectory ${trajectoryId}`;
  }
}
