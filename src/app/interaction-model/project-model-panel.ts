import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { resolvePair, type InteractionModel } from '../../../shared/interaction-model';
import { apiErrorMessage } from '../core/api-error';
import { pairSentence } from '../reports/energy-methods';
import { InteractionModelApi } from './interaction-model-api';
import { InteractionModelDialog, type InteractionModelDialogData } from './interaction-model-dialog';

/** The project's shared interaction model in words, and the way to edit it. */
@Component({
  selector: 'erg-project-model-panel',
  imports: [MatButtonModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (error()) { <p role="alert" class="error">{{ error() }}</p> }
    @if (model(); as m) {
      <p><strong>{{ m.name || 'Unnamed model' }}</strong>@if (m.source) { · {{ m.source }}}</p>
      <ul>@for (line of lines(); track line) { <li>{{ line }}</li> }</ul>
    } @else if (!error()) {
      <p class="muted">No shared model. Trajectories without a model of their own can only use energies stored in their files.</p>
    }
    <button mat-stroked-button type="button" (click)="edit()"><mat-icon>function</mat-icon> {{ model() ? 'Edit the shared model' : 'Give the project a model' }}</button>
  `,
  styles: `.muted { color: var(--mat-sys-on-surface-variant); } .error { color: var(--mat-sys-error); } ul { padding-left: 20px; }`,
})
export class ProjectModelPanel {
  readonly projectId = input.required<number>();
  readonly projectName = input.required<string>();
  private readonly api = inject(InteractionModelApi);
  private readonly dialog = inject(MatDialog);
  protected readonly model = signal<InteractionModel | null>(null);
  protected readonly lines = signal<string[]>([]);
  protected readonly error = signal('');

  constructor() {
    effect(() => this.load(this.projectId()));
  }

  private load(id: number): void {
    this.api.projectModel(id).subscribe({
      next: (m) => {
        this.model.set(m);
        this.lines.set(m ? m.pairs.map((p) => pairSentence(resolvePair(p) as unknown as Record<string, unknown>)) : []);
      },
      error: (err: unknown) => this.error.set(apiErrorMessage(err, 'The shared model could not be loaded.')),
    });
  }

  protected edit(): void {
    const data: InteractionModelDialogData = { target: { kind: 'project', id: this.projectId() }, name: this.projectName(), species: [], canEdit: true };
    this.dialog.open(InteractionModelDialog, { data, width: '880px', maxWidth: '96vw' }).afterClosed().subscribe((saved?: boolean) => {
      if (saved) this.load(this.projectId());
    });
  }
}
