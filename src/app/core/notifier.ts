import { inject, Injectable, Injector } from '@angular/core';
import type { MatSnackBar, MatSnackBarConfig } from '@angular/material/snack-bar';

/**
 * Short messages after an action ("User added"), and errors that have no form to sit in.
 * The snack bar (with its overlay and buttons, about a third of the start-up code) loads on the
 * first message: the guards and the HTTP interceptor need this service before any page shows.
 */
@Injectable({ providedIn: 'root' })
export class Notifier {
  private readonly injector = inject(Injector);
  private snackBar: Promise<MatSnackBar> | null = null;

  success(message: string): Promise<void> {
    return this.open(message, 'OK', { duration: 4000, politeness: 'polite' });
  }

  /**
   * Errors that belong to no form field (a refused move, a lost connection). They go by themselves
   * after a while, so they never sit over the controls of a tablet; field errors sit at the field.
   */
  error(message: string): Promise<void> {
    return this.open(message, 'Dismiss', {
      duration: 8000,
      politeness: 'assertive',
      panelClass: 'snack-error',
    });
  }

  private async open(message: string, action: string, config: MatSnackBarConfig): Promise<void> {
    this.snackBar ??= import('@angular/material/snack-bar').then((m) =>
      this.injector.get(m.MatSnackBar),
    );
    (await this.snackBar).open(message, action, config);
  }
}
