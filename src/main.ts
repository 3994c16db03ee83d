import { bootstrapApplication } from '@angular/platform-browser';

import { App } from './app/app';
import { appConfig } from './app/app.config';

bootstrapApplication(App, appConfig).catch((error: unknown) => {
  // Nothing else can report a failed start-up: the app itself is what failed to load.
  console.error(error);
  document.body.textContent =
    'Stepstock could not start. Reload the page; if it persists, tell the owner.';
});
