import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { EvidenceKind, EvidenceVerdict, MemberPhase } from '../../../shared/series-results';

const KIND_WORDS: Record<EvidenceKind, string> = {
  diffusion: 'Diffusion',
  lindemann: 'Lindemann ratio',
  structure: 'g(r) shape',
  density: 'Density',
  'structure-factor': 'S(q) peak',
};

const VERDICT_WORDS: Record<EvidenceVerdict, string> = {
  solid: 'solid', liquid: 'liquid', vapour: 'vapour', fluid: 'fluid (liquid or vapour)', condensed: 'condensed (solid or liquid)', neutral: 'in between', missing: 'not measured',
};

/** A member's phase with the evidence it was named from, each reading and the criterion it was held against. */
@Component({
  selector: 'erg-phase-evidence',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p class="reason">{{ phase().reason }}</p>
    <ul class="evidence" [attr.aria-label]="'Evidence for ' + phase().phase">
      @for (e of items(); track e.kind) {
        <li [class.missing]="e.verdict === 'missing'">
          <span class="kind">{{ e.kindWords }}</span>
          <span class="verdict" [attr.data-verdict]="e.verdict">{{ e.verdictWords }}</span>
          <span class="detail">{{ e.detail }}</span>
        </li>
      }
    </ul>
  `,
  styles: `
    :host { display: block; }
    .reason { margin: 0 0 6px; font: var(--mat-sys-body-medium); }
    .evidence { list-style: none; margin: 0; padding: 0; display: grid; grid-template-columns: max-content max-content minmax(0, 1fr); gap: 2px 10px; font: var(--mat-sys-body-small); }
    li { display: contents; }
    .kind { font-weight: 600; }
    .verdict { padding: 0 6px; border-radius: 6px; background: var(--mat-sys-surface-container-high); white-space: nowrap; align-self: start; justify-self: start; }
    .detail { overflow-wrap: anywhere; }
    li.missing .kind, li.missing .detail { color: var(--mat-sys-on-surface-variant); }
    @media (max-width: 600px) {
      .evidence { grid-template-columns: max-content minmax(0, 1fr); }
      .detail { grid-column: 1 / -1; margin-bottom: 4px; }
    }
  `,
})
export class PhaseEvidence {
  readonly phase = input.required<MemberPhase>();

  protected readonly items = computed(() => this.phase().evidence.map((e) => ({
    kind: e.kind, verdict: e.verdict, detail: e.detail, kindWords: KIND_WORDS[e.kind], verdictWords: VERDICT_WORDS[e.verdict],
  })));
}
