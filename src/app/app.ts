import { ChangeDetectionStrategy, Component } from '@angular/core';
import { RouterOutlet } from '@angular/router';
import { TopBar } from './shell/top-bar';

@Component({
  selector: 'erg-root',
  imports: [RouterOutlet, TopBar],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <a class="skip-link" href="#main-content" (click)="skipToMain($event)">Skip to main content</a>
    <erg-top-bar />
    <main id="main-content" tabindex="-1">
      <router-outlet />
    </main>
  `,
  styles: `
    .skip-link {
      position: absolute; left: 8px; top: -48px; z-index: 1000; padding: 8px 16px; border-radius: 8px;
      background: var(--mat-sys-primary); color: var(--mat-sys-on-primary); font: var(--mat-sys-label-large); text-decoration: none;
    }
    .skip-link:focus { top: 8px; }
    main:focus { outline: none; }
  `,
})
export class App {
  /** Moves focus (not only the scroll position) past the top bar, without the router treating the hash as a navigation. */
  protected skipToMain(event: Event): void {
    event.preventDefault();
    document.getElementById('main-content')?.focus();
  }
}
