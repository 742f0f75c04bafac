import { provideHttpClient, withInterceptors, withXsrfConfiguration } from '@angular/common/http';
import { inject, provideAppInitializer, provideZonelessChangeDetection, type ApplicationConfig } from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { routes } from './app.routes';
import { AuthState } from './core/auth-state';
import { unauthorizedInterceptor } from './core/unauthorized-interceptor';

export const appConfig: ApplicationConfig = {
  providers: [
    provideZonelessChangeDetection(),
    provideRouter(routes, withComponentInputBinding()),
    // The server's double-submit CSRF check: HttpClient copies the cookie into the header on writes.
    provideHttpClient(withInterceptors([unauthorizedInterceptor]), withXsrfConfiguration({ cookieName: 'XSRF-TOKEN', headerName: 'X-XSRF-TOKEN' })),
    // Icons come from the shipped Material Symbols font, never from a CDN.
    provideAppInitializer(() => {
      inject(MatIconRegistry).setDefaultFontSetClass('material-symbols-outlined');
    }),
    // Guards decide on the first navigation, so the session must be known before it.
    provideAppInitializer(() => inject(AuthState).restore()),
  ],
};
