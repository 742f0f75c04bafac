import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { FormBuilder, FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { analysisParamsSchema, DEFAULT_RDF_SPHERE_ATOMS, SPECTRAL_WINDOWS, SQ_WINDOWS, type AnalysisKey } from '../../../shared/analysis-params';
import { RUN_NOTES_MAX_LENGTH, type AnalysisRunDto, type StartAnalysis } from '../../../shared/analysis-run';
import type { RunEstimate } from '../../../shared/run-estimate';
import { catchError, debounceTime, map, merge, of, startWith, switchMap } from 'rxjs';
import { frameTimePs } from '../viewer/frame-time';
import { formatBytes } from '../../../shared/byte-size';
import type { TrajectoryDto } from '../../../shared/trajectory';
import { apiErrorMessage } from '../core/api-error';
import { ANALYSIS_CHOICES, defaultAnalyses, unavailableReason } from './analysis-choices';
import { fieldProblems, type FieldName } from './analysis-field-problems';
import { buildParams, settingsFromParams, type AdvancedSettings } from './analysis-params-form';
import { TrajectoriesApi } from './trajectories-api';

/** The settings of an earlier run, to run again with changes. */
export interface RunPreset {
  analyses: readonly string[];
  params: Record<string, unknown>;
  notes: string;
}

/** The trajectory to analyse, and optionally the run to start from. */
export type AnalysisDialogData = TrajectoryDto & { preset?: RunPreset };

/** A started run, or a request to open the metadata form (the time step is missing). */
export type AnalysisDialogResult = AnalysisRunDto | 'edit-metadata';

/** The analysis checklist with an advanced panel of parameters; starts one run. */
@Component({
  selector: 'erg-analysis-dialog',
  imports: [
    ReactiveFormsModule, MatDialogModule, MatCheckboxModule, MatExpansionModule, MatFormFieldModule, MatInputModule,
    MatSelectModule, MatSlideToggleModule, MatButtonModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>{{ t.preset ? 'Adjust and run' : 'Analyse' }} {{ t.name }}</h2>
    <mat-dialog-content>
      <p class="facts">{{ t.atoms }} atoms · {{ t.frames }} frames · {{ t.timeStep === null ? '?' : significant(t.timeStep) }} {{ t.timeUnit }} between frames ·
        {{ t.hasVelocities ? 'velocities in the file' : 'no velocities: the VACF uses central differences of positions' }}</p>
      @if (!t.timeStep) {
        <p class="warn" role="alert">
          The time between frames is not known, so the server cannot run time-based analyses of this file.
          <button mat-button type="button" (click)="editMetadata()">Set it in the metadata</button>
        </p>
      }
      @if (t.preset) { <p class="facts">Settings of the report you came from; change what you need.</p> }
      @if (suggestedDiscardPs(); as ps) {
        <p class="suggestion">
          Inspection judged the run equilibrated from frame {{ t.equilibration!.frame + 1 }} (about {{ significant(ps) }} ps), from {{ t.equilibration!.judgedFrom }}.
          <button mat-button type="button" (click)="useSuggestedDiscard(ps)">Discard the first {{ significant(ps) }} ps</button>
        </p>
      }
      <fieldset class="checklist">
        <legend>Analyses</legend>
        @for (choice of choices; track choice.key) {
          <div class="choice">
            <mat-checkbox [checked]="selected().has(choice.key)" [disabled]="!!reasonOf(choice.key)" (change)="toggle(choice.key, $event.checked)">
              <strong>{{ choice.title }}</strong>
            </mat-checkbox>
            <div class="description">{{ reasonOf(choice.key) ? 'Not available: ' + reasonOf(choice.key) : choice.description }}</div>
          </div>
        }
      </fieldset>
      <mat-form-field appearance="outline" class="notes">
        <mat-label>Notes for this run</mat-label>
        <textarea matInput [formControl]="notes" rows="2" [maxlength]="notesMax"></textarea>
        <mat-hint>Optional: why this run, e.g. "fit window moved later". Shown with its report.</mat-hint>
      </mat-form-field>
      <mat-accordion>
        <mat-expansion-panel [expanded]="advancedOpen()" (opened)="advancedOpen.set(true)" (closed)="advancedOpen.set(false)">
          <mat-expansion-panel-header><mat-panel-title>Advanced settings</mat-panel-title></mat-expansion-panel-header>
          <form [formGroup]="form" class="advanced">
            <h3>Frames</h3>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>From frame</mat-label>
              <input matInput type="number" formControlName="fromFrame" min="1" [attr.max]="t.frames" step="1">
              <mat-hint>Counted from 1. Empty: the first (1)</mat-hint>
            <mat-error>{{ fieldErrors()['fromFrame'] }}</mat-error></mat-form-field>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>To frame (included)</mat-label>
              <input matInput type="number" formControlName="toFrame" min="1" [attr.max]="t.frames" step="1">
              <mat-hint>Empty: the last ({{ t.frames }})</mat-hint>
            <mat-error>{{ fieldErrors()['toFrame'] }}</mat-error></mat-form-field>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Stride</mat-label>
              <input matInput type="number" formControlName="frameStride" min="1" step="1">
              <mat-hint>Empty: 1 (more above 100 000 frames)</mat-hint>
            <mat-error>{{ fieldErrors()['frameStride'] }}</mat-error></mat-form-field>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Discard for equilibration (ps)</mat-label>
              <input matInput type="number" formControlName="discardPs" min="0" step="any">
              <mat-hint>Left out at the start of the range</mat-hint>
            <mat-error>{{ fieldErrors()['discardPs'] }}</mat-error></mat-form-field>
            <h3>Atoms and time</h3>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Species</mat-label>
              <mat-select formControlName="species" multiple>
                @for (s of speciesList; track s) { <mat-option [value]="s">{{ s }}</mat-option> }
              </mat-select>
              <mat-hint>Empty means all atoms</mat-hint>
            <mat-error>{{ fieldErrors()['species'] }}</mat-error></mat-form-field>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Longest lag (ps)</mat-label>
              <input matInput type="number" formControlName="maxLagPs" min="0" step="any">
              <mat-hint>Empty: half the run</mat-hint>
            <mat-error>{{ fieldErrors()['maxLagPs'] }}</mat-error></mat-form-field>
            <mat-slide-toggle formControlName="removeComDrift">Remove centre-of-mass drift</mat-slide-toggle>
            <h3>Diffusion fit (MSD)</h3>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Fit window</mat-label>
              <mat-select formControlName="fitMode">
                <mat-option value="auto">Automatic (where the log–log slope is near 1)</mat-option>
                <mat-option value="manual">Manual</mat-option>
              </mat-select>
            <mat-error>{{ fieldErrors()['fitMode'] }}</mat-error></mat-form-field>
            @if (form.controls.fitMode.value === 'manual') {
              <mat-form-field appearance="outline" subscriptSizing="dynamic"><mat-label>Fit from (ps)</mat-label><input matInput type="number" formControlName="fitStartPs" step="any"><mat-error>{{ fieldErrors()['fitStartPs'] }}</mat-error></mat-form-field>
              <mat-form-field appearance="outline" subscriptSizing="dynamic"><mat-label>Fit to (ps)</mat-label><input matInput type="number" formControlName="fitEndPs" step="any"><mat-error>{{ fieldErrors()['fitEndPs'] }}</mat-error></mat-form-field>
            }
            <h3>Green–Kubo plateau (VACF)</h3>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Plateau window</mat-label>
              <mat-select formControlName="gkMode">
                <mat-option value="auto">Automatic</mat-option>
                <mat-option value="manual">Manual</mat-option>
              </mat-select>
            <mat-error>{{ fieldErrors()['gkMode'] }}</mat-error></mat-form-field>
            @if (form.controls.gkMode.value === 'manual') {
              <mat-form-field appearance="outline" subscriptSizing="dynamic"><mat-label>Plateau from (ps)</mat-label><input matInput type="number" formControlName="gkStartPs" step="any"><mat-error>{{ fieldErrors()['gkStartPs'] }}</mat-error></mat-form-field>
              <mat-form-field appearance="outline" subscriptSizing="dynamic"><mat-label>Plateau to (ps)</mat-label><input matInput type="number" formControlName="gkEndPs" step="any"><mat-error>{{ fieldErrors()['gkEndPs'] }}</mat-error></mat-form-field>
            }
            <h3>Spectrum and heat capacity (VDOS)</h3>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Window function</mat-label>
              <mat-select formControlName="window">
                @for (w of windows; track w) { <mat-option [value]="w">{{ w }}</mat-option> }
              </mat-select>
            <mat-error>{{ fieldErrors()['window'] }}</mat-error></mat-form-field>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Zero padding (×)</mat-label>
              <input matInput type="number" formControlName="zeroPadFactor" min="1" max="16" step="1">
            <mat-error>{{ fieldErrors()['zeroPadFactor'] }}</mat-error></mat-form-field>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Temperature for Cv (K)</mat-label>
              <input matInput type="number" formControlName="temperatureK" min="0" step="any">
              <mat-hint>Empty: the kinetic temperature{{ t.temperatureK !== null ? '; stated ' + t.temperatureK + ' K is shown beside it' : '' }}</mat-hint>
            <mat-error>{{ fieldErrors()['temperatureK'] }}</mat-error></mat-form-field>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Degrees of freedom</mat-label>
              <input matInput type="number" formControlName="degreesOfFreedom" min="1" step="1">
              <mat-hint>Empty: 3N − constraints − 3</mat-hint>
            <mat-error>{{ fieldErrors()['degreesOfFreedom'] }}</mat-error></mat-form-field>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Constraints</mat-label>
              <input matInput type="number" formControlName="constraints" min="0" step="1">
              <mat-hint>Empty: as stated with the trajectory ({{ t.constraints ?? 0 }})</mat-hint>
            <mat-error>{{ fieldErrors()['constraints'] }}</mat-error></mat-form-field>
            <h3>Energy</h3>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>NVE drift threshold (k_BT per atom per ns)</mat-label>
              <input matInput type="number" formControlName="driftThresholdKTPerNs" min="0" step="any">
              <mat-hint>Empty: 0.01, a rule of thumb of the trade</mat-hint>
            <mat-error>{{ fieldErrors()['driftThresholdKTPerNs'] }}</mat-error></mat-form-field>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Barostat pressure for C_P (bar)</mat-label>
              <input matInput type="number" formControlName="externalPressureBar" step="any">
              <mat-hint>Empty: the mean virial pressure (NPT runs)</mat-hint>
            <mat-error>{{ fieldErrors()['externalPressureBar'] }}</mat-error></mat-form-field>
            <h3>Structure (g(r), S(q))</h3>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>r_max (Å)</mat-label>
              <input matInput type="number" formControlName="rMaxA" min="0" step="any">
              <mat-hint>Empty: half the shortest cell width, at most the radius of about {{ sphereAtoms }} atoms</mat-hint>
            <mat-error>{{ fieldErrors()['rMaxA'] }}</mat-error></mat-form-field>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Bin width (Å)</mat-label>
              <input matInput type="number" formControlName="binWidthA" min="0" max="1" step="any">
            <mat-error>{{ fieldErrors()['binWidthA'] }}</mat-error></mat-form-field>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>Species pair</mat-label>
              <mat-select formControlName="pair">
                <mat-option [value]="null">Every pair</mat-option>
                @for (p of pairs; track p) { <mat-option [value]="p">{{ p }}</mat-option> }
              </mat-select>
            <mat-error>{{ fieldErrors()['pair'] }}</mat-error></mat-form-field>
            <mat-form-field appearance="outline" subscriptSizing="dynamic">
              <mat-label>S(q) window</mat-label>
              <mat-select formControlName="sqWindow">
                @for (w of sqWindows; track w) { <mat-option [value]="w">{{ w }}</mat-option> }
              </mat-select>
            <mat-error>{{ fieldErrors()['sqWindow'] }}</mat-error></mat-form-field>
          </form>
        </mat-expansion-panel>
      </mat-accordion>
      @for (problem of problems(); track problem) { <p class="error" role="alert">{{ problem }}</p> }
    </mat-dialog-content>
    <div class="estimate-bar">
      @if (estimate(); as e) {
        <p class="estimate" aria-live="polite">
          Estimated {{ durationText(e.seconds) === 'under a second' ? '' : 'about ' }}{{ durationText(e.seconds) }} and {{ bytesText(e.memoryBytes) }} of memory{{ e.scratchBytes > 0 ? ' (the frames wait in ' + bytesText(e.scratchBytes) + ' of scratch disk)' : '' }}, on {{ e.frames.used }} frames
          (from frame {{ e.frames.from + 1 }} to {{ e.frames.to }}{{ e.frames.stride > 1 ? ', every ' + e.frames.stride + (e.frames.autoStride ? ', chosen for a long run' : '') : '' }}){{ e.rMaxA !== null ? '; g(r) to ' + significant(e.rMaxA) + ' Å' : '' }}.
        </p>
        @if (!e.withinLimits) {
          <div class="error" role="alert">
            <p>This is past what this site runs (about {{ durationText(e.limits.seconds) }} and {{ bytesText(e.limits.memoryBytes) }}). Any one of these brings it within:</p>
            <ul>@for (a of e.advice; track a) { <li>{{ a }}</li> }</ul>
          </div>
        }
      }
    </div>
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>Cancel</button>
      <button mat-flat-button type="button" (click)="start()" [disabled]="starting() || selected().size === 0 || !t.timeStep || estimate()?.withinLimits === false">Start analysis</button>
    </mat-dialog-actions>
  `,
  styles: `
    .facts { color: var(--mat-sys-on-surface-variant); margin-top: 0; }
    .warn { color: var(--mat-sys-tertiary); }
    .checklist { border: none; padding: 0; margin: 0 0 16px; display: grid; gap: 4px; }
    .checklist legend { font-weight: 600; margin-bottom: 4px; }
    .description { margin-left: 40px; color: var(--mat-sys-on-surface-variant); font-size: 13px; }
    /* One column on a phone, two where they fit; hints and errors take the lines they need (dynamic subscripts). */
    .advanced { display: grid; grid-template-columns: repeat(auto-fill, minmax(min(100%, 240px), 1fr)); gap: 12px 16px; align-items: start; padding-top: 4px; }
    .advanced h3 { grid-column: 1 / -1; margin: 12px 0 0; }
    .advanced mat-form-field { width: 100%; }
    .advanced mat-slide-toggle { align-self: center; }
    .error { color: var(--mat-sys-error); }
    .error ul { margin: 4px 0 0; padding-left: 20px; }
    .suggestion { margin: 0 0 8px; }
    .estimate-bar { padding: 0 24px; }
    .estimate { color: var(--mat-sys-on-surface-variant); margin: 8px 0 0; font-size: 13px; }
    .notes { width: 100%; margin-bottom: 8px; }
  `,
})
export class AnalysisDialog {
  protected readonly t = inject<AnalysisDialogData>(MAT_DIALOG_DATA);
  private readonly api = inject(TrajectoriesApi);
  private readonly ref = inject(MatDialogRef<AnalysisDialog, AnalysisDialogResult>);
  protected readonly choices = ANALYSIS_CHOICES;
  protected readonly windows = SPECTRAL_WINDOWS;
  protected readonly sqWindows = SQ_WINDOWS;
  protected readonly sphereAtoms = DEFAULT_RDF_SPHERE_ATOMS;
  protected readonly speciesList = Object.keys(this.t.speciesCounts ?? {});
  protected readonly pairs = this.speciesList.flatMap((a, i) => this.speciesList.slice(i).map((b) => `${a}–${b}`));
  protected readonly selected = signal(new Set<AnalysisKey>(this.t.preset
    ? this.t.preset.analyses.filter((k): k is AnalysisKey => ANALYSIS_CHOICES.some((c) => c.key === k) && !unavailableReason(k as AnalysisKey, this.t))
    : defaultAnalyses(this.t)));
  protected readonly notesMax = RUN_NOTES_MAX_LENGTH;
  protected readonly notes = new FormControl(this.t.preset?.notes ?? '', { nonNullable: true, validators: [Validators.maxLength(RUN_NOTES_MAX_LENGTH)] });
  protected readonly starting = signal(false);
  private readonly serverError = signal('');
  private readonly formErrors = signal<string[]>([]);
  protected readonly problems = computed(() => [
    ...this.formErrors(), ...[this.estimateProblem(), this.serverError()].filter((p, i, all) => p && all.indexOf(p) === i),
  ]);

  protected readonly advancedOpen = signal(!!this.t.preset);
  /** What is wrong with each advanced field, in words, shown under it. */
  protected readonly fieldErrors = signal<Partial<Record<FieldName, string>>>({});

  protected readonly form = inject(FormBuilder).nonNullable.group({
    fromFrame: null as number | null, toFrame: null as number | null, frameStride: null as number | null, discardPs: null as number | null,
    species: [[] as string[]], maxLagPs: null as number | null, removeComDrift: true, fitMode: 'auto' as AdvancedSettings['fitMode'], fitStartPs: null as number | null, fitEndPs: null as number | null,
    gkMode: 'auto' as AdvancedSettings['gkMode'], gkStartPs: null as number | null, gkEndPs: null as number | null,
    window: 'hann' as AdvancedSettings['window'], zeroPadFactor: 1, temperatureK: null as number | null,
    degreesOfFreedom: null as number | null, constraints: null as number | null, rMaxA: null as number | null, binWidthA: 0.05, pair: null as string | null,
    sqWindow: 'lorch' as AdvancedSettings['sqWindow'], driftThresholdKTPerNs: null as number | null, externalPressureBar: null as number | null,
  });

  /** The discard inspection suggests, in ps, or null when it found none (or the run was equilibrated from the start). */
  protected readonly suggestedDiscardPs = computed(() => {
    const e = this.t.equilibration;
    if (!e || e.frame === 0) return null;
    return frameTimePs({ index: e.frame, time: null }, this.t.timeStep, this.t.timeUnit);
  });

  /** The server's estimate for what the dialog would start, refreshed as the choices change. */
  protected readonly estimate = signal<RunEstimate | null>(null);
  /** Why the current choices cannot run (a frame range past the end, say), as the server put it. */
  private readonly estimateProblem = signal('');

  constructor() {
    if (this.t.preset) this.form.patchValue(settingsFromParams(this.t.preset.params, this.form.getRawValue()));
    this.form.valueChanges.pipe(startWith(null), takeUntilDestroyed()).subscribe(() => this.checkFields());
    merge(this.form.valueChanges, toObservable(this.selected)).pipe(
      startWith(null),
      debounceTime(300),
      map(() => this.request()),
      switchMap((body) => (body
        ? this.api.estimateAnalysis(this.t.id, body).pipe(
          map((estimate) => ({ estimate, problem: '' })),
          catchError((err: unknown) => of({ estimate: null, problem: apiErrorMessage(err, 'The cost could not be estimated.') })))
        : of({ estimate: null, problem: '' }))),
      takeUntilDestroyed(),
    ).subscribe(({ estimate, problem }) => {
      this.estimate.set(estimate);
      this.estimateProblem.set(problem);
    });
  }

  /** Closes the dialog so the page opens the metadata form instead. */
  protected editMetadata(): void {
    this.ref.close('edit-metadata');
  }

  protected useSuggestedDiscard(ps: number): void {
    this.form.controls.discardPs.setValue(Number(ps.toPrecision(6)));
  }

  protected durationText(seconds: number): string {
    if (seconds < 1) return 'under a second';
    if (seconds < 90) return `${Math.round(seconds)} s`;
    if (seconds < 5400) return `${Math.round(seconds / 60)} min`;
    return `${(seconds / 3600).toFixed(1)} h`;
  }

  protected bytesText(bytes: number): string {
    return formatBytes(bytes);
  }

  /** The body the dialog would send, or null while the settings are incomplete. */
  private request(): StartAnalysis | null {
    if (this.selected().size === 0) return null;
    // A field the dialog already marks is not sent: the server would answer in the API's 0-based frame count.
    if (Object.keys(fieldProblems(this.form.getRawValue(), this.t.frames ?? undefined)).length) return null;
    const built = buildParams(this.form.getRawValue());
    const parsed = analysisParamsSchema.safeParse(built.params);
    if (built.problems.length || !parsed.success) return null;
    return { analyses: [...this.selected()], params: parsed.data };
  }

  protected significant(value: number): string {
    return Number(value.toPrecision(4)).toString();
  }

  protected reasonOf(key: AnalysisKey): string | null {
    return unavailableReason(key, this.t);
  }

  protected toggle(key: AnalysisKey, on: boolean): void {
    this.selected.update((set) => {
      const next = new Set(set);
      if (on) next.add(key);
      else next.delete(key);
      return next;
    });
  }

  /** Puts each field's problem on its control, so the field turns red and says it beneath. */
  private checkFields(): Partial<Record<FieldName, string>> {
    const problems = fieldProblems(this.form.getRawValue(), this.t.frames ?? undefined);
    this.fieldErrors.set(problems);
    for (const [name, control] of Object.entries(this.form.controls)) {
      const problem = problems[name as FieldName];
      control.setErrors(problem ? { problem } : null);
    }
    return problems;
  }

  protected start(): void {
    this.serverError.set('');
    const fields = this.checkFields();
    const built = buildParams(this.form.getRawValue());
    const parsed = analysisParamsSchema.safeParse(built.params);
    if (Object.keys(fields).length || built.problems.length || !parsed.success) {
      this.form.markAllAsTouched();
      this.advancedOpen.set(true);
      this.formErrors.set(['Some advanced settings need a change: each says what beneath it.']);
      return;
    }
    this.formErrors.set([]);
    this.starting.set(true);
    this.api.startAnalysis(this.t.id, { analyses: [...this.selected()], params: parsed.data, notes: this.notes.value }).subscribe({
      next: (run) => this.ref.close(run),
      error: (err: unknown) => {
        this.starting.set(false);
        this.serverError.set(apiErrorMessage(err, 'The analysis could not be started.'));
      },
    });
  }
}
