import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

@Component({
  selector: 'erg-projects-page',
  imports: [MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1>Projects</h1>
      <div class="empty" role="status">
        <mat-icon aria-hidden="true">folder_open</mat-icon>
        <p>No projects yet. A project holds a team's trajectories, analyses and reports.</p>
      </div>
    </section>
  `,
  styles: `.empty { display: flex; align-items: center; gap: 12px; color: var(--mat-sys-on-surface-variant); }`,
})
export default class ProjectsPage {}
