import { provideHttpClient, withInterceptors, withXsrfConfiguration } from '@angular/common/http';
import {
  ApplicationConfig,
  inject,
  isDevMode,
  provideAppInitializer,
  provideBrowserGlobalErrorListeners,
} from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { provideRouter, TitleStrategy, withComponentInputBinding } from '@angular/router';
import { provideServiceWorker } from '@angular/service-worker';

import { routes } from './app.routes';
import { PageTitle } from './core/page-title';
import { provideShopDateAdapter } from './core/shop-date-adapter';
import { offlineInterceptor } from './core/offline-interceptor';
import { unauthorizedInterceptor } from './core/unauthorized-interceptor';

export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    provideRouter(routes, withComponentInputBinding()),
    { provide: TitleStrategy, useClass: PageTitle },
    // One date pattern for every date field, from the shop's locale setting.
    provideShopDateAdapter(),
    provideHttpClient(
      withInterceptors([unauthorizedInterceptor, offlineInterceptor]),
      // The server sets the XSRF-TOKEN cookie and checks this header on every mutating request.
      withXsrfConfiguration({ cookieName: 'XSRF-TOKEN', headerName: 'X-XSRF-TOKEN' }),
    ),
    // The shell, assets and the bench's pages stay readable when the workshop network drops
    // (ngsw-config.json). Only the production build has the worker; a development server has none.
    provideServiceWorker('ngsw-worker.js', {
      enabled: !isDevMode(),
      // Registered once the first page has settled, so it never competes with the first load.
      registrationStrategy: 'registerWhenStable:10000',
    }),
    // Our icon font is Material Symbols Outlined (styles.scss), not the older Material Icons.
    provideAppInitializer(() => {
      inject(MatIconRegistry).setDefaultFontSetClass('material-symbols-outlined');
    }),
  ],
};
