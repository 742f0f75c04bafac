import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDividerModule } from '@angular/material/divider';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatToolbarModule } from '@angular/material/toolbar';
import { Router, RouterLink, RouterLinkActive } from '@angular/router';
import { AuthState } from '../core/auth-state';
import { Logo } from './logo';

@Component({
  selector: 'erg-top-bar',
  imports: [MatToolbarModule, MatButtonModule, MatDividerModule, MatIconModule, MatMenuModule, RouterLink, RouterLinkActive, Logo],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <mat-toolbar class="top-bar">
      <a class="brand" routerLink="/projects" aria-label="Ergodic home">
        <erg-logo />
        <span class="name">Ergodic</span>
      </a>
      @if (auth.isSignedIn()) {
        <nav aria-label="Main">
          <a mat-button routerLink="/projects" routerLinkActive="active">Projects</a>
        </nav>
      }
      <span class="spacer"></span>
      @if (auth.user(); as user) {
        <button mat-button type="button" [matMenuTriggerFor]="userMenu" aria-label="Account menu for {{ user.displayName }}">
          <mat-icon aria-hidden="true">account_circle</mat-icon> <span class="user-name">{{ user.displayName }}</span>
        </button>
        <mat-menu #userMenu="matMenu">
          <div class="who" aria-hidden="true">{{ user.email }}</div>
          <a mat-menu-item routerLink="/account/tokens"><mat-icon aria-hidden="true">key</mat-icon> API tokens</a>
          @if (auth.isAdmin()) {
            <mat-divider />
            <a mat-menu-item routerLink="/admin/users"><mat-icon aria-hidden="true">group</mat-icon> Users</a>
            <a mat-menu-item routerLink="/admin/mail"><mat-icon aria-hidden="true">mail</mat-icon> Sent mail</a>
          }
          <mat-divider />
          <button mat-menu-item type="button" (click)="signOut()"><mat-icon aria-hidden="true">logout</mat-icon> Sign out</button>
        </mat-menu>
      } @else {
        <a mat-stroked-button routerLink="/sign-in"><mat-icon aria-hidden="true">login</mat-icon> Sign in</a>
      }
    </mat-toolbar>
  `,
  styles: `
    .top-bar { gap: 16px; min-width: 0; overflow: hidden; background: var(--mat-sys-surface-container); border-bottom: 1px solid var(--mat-sys-outline-variant); }
    .brand { display: inline-flex; align-items: center; gap: 10px; color: var(--mat-sys-on-surface); text-decoration: none; }
    .name { font-weight: 600; letter-spacing: 0.02em; }
    .spacer { flex: 1; }
    .active { background: var(--mat-sys-secondary-container); }
    /* A long name shortens with an ellipsis; on a phone only the icon stays (the menu names the account). */
    .user-name { display: inline-block; max-width: 24ch; overflow: hidden; text-overflow: ellipsis; white-space: nowrap; vertical-align: bottom; }
    @media (max-width: 599.98px) {
      .top-bar { gap: 4px; padding: 0 8px; }
      .user-name { max-width: 9ch; }
    }
    .who { padding: 8px 16px; font-size: 0.85rem; color: var(--mat-sys-on-surface-variant); }
  `,
})
export class TopBar {
  protected readonly auth = inject(AuthState);
  private readonly router = inject(Router);

  protected async signOut(): Promise<void> {
    await this.auth.signOut();
    await this.router.navigateByUrl('/sign-in');
  }
}
