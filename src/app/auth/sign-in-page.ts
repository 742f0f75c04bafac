import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatCardModule } from '@angular/material/card';

@Component({
  selector: 'erg-sign-in-page',
  imports: [MatCardModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <mat-card appearance="outlined">
        <mat-card-header><mat-card-title>Sign in</mat-card-title></mat-card-header>
        <mat-card-content><p>Accounts arrive with the next release of Ergodic.</p></mat-card-content>
      </mat-card>
    </section>
  `,
})
export default class SignInPage {}
