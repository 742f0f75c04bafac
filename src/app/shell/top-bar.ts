import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatToolbarModule } from '@angular/material/toolbar';
import { RouterLink, RouterLinkActive } from '@angular/router';
import { Logo } from './logo';

@Component({
  selector: 'erg-top-bar',
  imports: [MatToolbarModule, MatButtonModule, MatIconModule, RouterLink, RouterLinkActive, Logo],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <mat-toolbar class="top-bar">
      <a class="brand" routerLink="/projects" aria-label="Ergodic home">
        <erg-logo />
        <span class="name">Ergodic</span>
      </a>
      <nav aria-label="Main">
        <a mat-button routerLink="/projects" routerLinkActive="active">Projects</a>
      </nav>
      <span class="spacer"></span>
      <a mat-stroked-button routerLink="/sign-in"><mat-icon>login</mat-icon> Sign in</a>
    </mat-toolbar>
  `,
  styles: `
    .top-bar { gap: 16px; background: var(--mat-sys-surface-container); border-bottom: 1px solid var(--mat-sys-outline-variant); }
    .brand { display: inline-flex; align-items: center; gap: 10px; color: var(--mat-sys-on-surface); text-decoration: none; }
    .name { font-weight: 600; letter-spacing: 0.02em; }
    .spacer { flex: 1; }
    .active { background: var(--mat-sys-secondary-container); }
  `,
})
export class TopBar {}
