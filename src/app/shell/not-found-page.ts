import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

@Component({
  selector: 'erg-not-found-page',
  imports: [MatButtonModule, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1>Page not found</h1>
      <p>There is nothing at this address.</p>
      <a mat-flat-button routerLink="/projects">Go to projects</a>
    </section>
  `,
})
export default class NotFoundPage {}
