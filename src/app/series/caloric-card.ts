import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { CaloricCurve, HeatCapacityPoint } from '../../../shared/series-results';
import { formatNumber, formatWithError } from '../reports/number-format';

const SOURCE_WORDS: Record<HeatCapacityPoint['source'], string> = { slope: 'dE/dT', fluctuation: 'fluctuations', 'harmonic-vdos': 'harmonic (VDOS)' };

/** The caloric curve's kind, the latent heat from its jump, and Cv(T) from every route, as numbers. */
@Component({
  selector: 'erg-caloric-card',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="card" aria-labelledby="caloric-heading">
      <h3 id="caloric-heading">Caloric curve, latent heat and Cv(T)</h3>
      <p class="muted">{{ caloric().note }}</p>
      @if (caloric().latentHeat; as l) {
        <p class="value" aria-label="Latent heat">L = <strong>{{ latentKJ() }} kJ/mol</strong> = <strong>{{ latentEV() }} eV/atom</strong></p>
        <p>at {{ fmt(l.atK) }} K · {{ l.method }}</p>
      } @else {
        <p>{{ caloric().latentHeatNote || 'No latent heat: the caloric curve shows no jump between bracketing members.' }}</p>
      }
      @if (cv().length) {
        <table aria-label="Heat capacity per atom">
          <thead><tr><th scope="col" class="num">T (K)</th><th scope="col" class="num">Cv (k_B/atom)</th><th scope="col" class="num">J/(mol·K)</th><th scope="col">From</th></tr></thead>
          <tbody>
            @for (p of cv(); track $index) {
              <tr [class.across]="p.across"><td class="num">{{ p.t }}</td><td class="num">{{ p.kb }}</td><td class="num">{{ p.j }}</td><td>{{ p.source }}</td></tr>
            }
          </tbody>
        </table>
        @if (anyAcross()) { <p class="muted">Slopes marked “across a transition” hold latent heat, not heat capacity.</p> }
      }
    </section>
  `,
  styleUrl: './result-card.scss',
  styles: `tr.across td { color: var(--mat-sys-on-surface-variant); font-style: italic; }`,
})
export class CaloricCard {
  readonly caloric = input.required<CaloricCurve>();
  readonly heatCapacity = input.required<HeatCapacityPoint[]>();

  protected readonly fmt = (v: number) => formatNumber(v, 4);
  protected readonly latentKJ = computed(() => formatWithError(this.caloric().latentHeat?.kJPerMol, this.caloric().latentHeat?.stdErrorKJPerMol));
  protected readonly latentEV = computed(() => formatWithError(this.caloric().latentHeat?.eVPerAtom, this.caloric().latentHeat?.stdErrorEVPerAtom));
  protected readonly cv = computed(() => [...this.heatCapacity()].sort((a, b) => a.temperatureK - b.temperatureK).map((p) => ({
    t: formatNumber(p.temperatureK, 4), kb: formatWithError(p.perAtomKB, p.stdErrorKB), j: formatNumber(p.jPerMolK, 4),
    source: `${SOURCE_WORDS[p.source]}${p.acrossTransition ? ', across a transition' : ''}${p.energyKind === 'kinetic' ? ' (kinetic only)' : ''}`, across: p.acrossTransition,
  })));
  protected readonly anyAcross = computed(() => this.heatCapacity().some((p) => p.acrossTransition));
}
