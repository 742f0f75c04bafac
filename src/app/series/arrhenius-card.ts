import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ArrheniusFitResult, SeriesMemberResult } from '../../../shared/series-results';
import { formatNumber, formatWithError } from '../reports/number-format';
import { diffusionLabel, type DiffusionUnit } from '../reports/report-units';

const ERROR_METHOD_WORDS: Record<ArrheniusFitResult['errorMethod'], string> = {
  'd-errors': 'weighted by the members’ D errors; parameter errors scaled up by √(χ²/ν) where the scatter exceeds them',
  scatter: 'equal weights (members lack D errors); errors from the scatter about the line',
  none: 'two points without errors: no error can be given',
};

/** The Arrhenius fit: E_a in kJ/mol and eV, D₀, the range, the residuals and what to beware of. */
@Component({
  selector: 'erg-arrhenius-card',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="card" aria-labelledby="arrhenius-heading">
      <h3 id="arrhenius-heading">Activation energy of diffusion</h3>
      @if (fit().status === 'fitted' && fit().activationEnergy; as ea) {
        <p class="value" aria-label="Activation energy">
          E<sub>a</sub> = <strong>{{ eaKJ() }} kJ/mol</strong> = <strong>{{ eaEV() }} eV</strong>
        </p>
        <dl>
          <dt>D₀</dt><dd>{{ d0() }} {{ unitLabel() }}</dd>
          <dt>Fitted range</dt><dd>{{ range() }}</dd>
          <dt>Points</dt><dd>{{ fit().points.length }}, {{ fit().degreesOfFreedom }} degrees of freedom{{ chi() }}</dd>
          <dt>Weights</dt><dd>{{ errorMethod() }}</dd>
        </dl>
        <table class="residuals" aria-label="Residuals of the Arrhenius fit">
          <thead><tr><th scope="col">Member</th><th scope="col" class="num">T (K)</th><th scope="col" class="num">ln D − fit</th><th scope="col" class="num">in σ</th></tr></thead>
          <tbody>
            @for (p of residuals(); track p.trajectoryId) {
              <tr><td>{{ p.name }}</td><td class="num">{{ p.t }}</td><td class="num">{{ p.residual }}</td><td class="num">{{ p.sigmas }}</td></tr>
            }
          </tbody>
        </table>
      } @else {
        <p class="muted" role="status">{{ fit().message ?? 'No fit yet: it needs at least two members with a diffusion coefficient and a temperature.' }}</p>
      }
      @for (l of fit().leftOut; track l.trajectoryId) {
        <p class="left-out">{{ nameOf(l.trajectoryId) }}: {{ l.reason }}</p>
      }
      @for (w of fit().warnings; track w) {
        <p class="warning" role="note">{{ w }}</p>
      }
    </section>
  `,
  styleUrl: './result-card.scss',
})
export class ArrheniusCard {
  readonly fit = input.required<ArrheniusFitResult>();
  readonly members = input.required<SeriesMemberResult[]>();
  readonly unit = input.required<DiffusionUnit>();

  protected readonly unitLabel = computed(() => diffusionLabel(this.unit()));
  protected readonly eaKJ = computed(() => formatWithError(this.fit().activationEnergy?.kJPerMol, this.fit().activationEnergyStdError?.kJPerMol));
  protected readonly eaEV = computed(() => formatWithError(this.fit().activationEnergy?.eV, this.fit().activationEnergyStdError?.eV));
  protected readonly d0 = computed(() => formatWithError(this.fit().d0?.[this.unit()], this.fit().d0StdError?.[this.unit()]));
  protected readonly range = computed(() => {
    const r = this.fit().rangeK;
    return r ? `${formatNumber(r.min, 4)} to ${formatNumber(r.max, 4)} K` : '—';
  });
  protected readonly chi = computed(() => {
    const f = this.fit();
    return f.chiSquared !== null && f.degreesOfFreedom > 0 ? `, χ²/ν = ${formatNumber(f.chiSquared / f.degreesOfFreedom, 3)}` : '';
  });
  protected readonly errorMethod = computed(() => ERROR_METHOD_WORDS[this.fit().errorMethod]);
  protected readonly residuals = computed(() => this.fit().points.map((p) => ({
    trajectoryId: p.trajectoryId, name: this.nameOf(p.trajectoryId), t: formatNumber(p.temperatureK, 4),
    residual: formatNumber(p.lnResidual, 3), sigmas: p.normalisedResidual === null ? '—' : formatNumber(p.normalisedResidual, 2),
  })));

  protected nameOf(trajectoryId: number): string {
    return this.members().find((m) => m.trajectoryId === trajectoryId)?.name ?? `trajectory ${trajectoryId}`;
  }
}
