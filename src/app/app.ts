import { ChangeDetectionStrategy, Component } from '@angular/core';
import { RouterOutlet } from '@angular/router';
import { TopBar } from './shell/top-bar';

@Component({
  selector: 'erg-root',
  imports: [RouterOutlet, TopBar],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <erg-top-bar />
    <main id="main-content">
      <router-outlet />
    </main>
  `,
})
export class App {}
