import { ChangeDetectionStrategy, Component, effect, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';

/**
 * The eye at the end of a password field (`<app-reveal-password matSuffix [field]="box" />` with
 * `#box` on the input): shows what was typed, and hides it again. A pressed toggle, named for
 * what it does next.
 */
@Component({
  selector: 'app-reveal-password',
  imports: [MatButtonModule, MatIconModule, MatTooltipModule],
  template: `
    <button
      mat-icon-button
      type="button"
      [attr.aria-label]="shown() ? 'Hide password' : 'Show password'"
      [matTooltip]="shown() ? 'Hide password' : 'Show password'"
      [attr.aria-pressed]="shown()"
      (click)="shown.set(!shown())"
    >
      <mat-icon>{{ shown() ? 'visibility_off' : 'visibility' }}</mat-icon>
    </button>
  `,
  // No box of its own: the button sits in the field's suffix as if written there.
  // (a host style, not an inline stylesheet: see ui/list-fields.ts on identical inline styles)
  host: { style: 'display: contents' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RevealPassword {
  /** The password input this shows and hides. */
  readonly field = input.required<HTMLInputElement>();
  protected readonly shown = signal(false);

  constructor() {
    effect(() => {
      this.field().type = this.shown() ? 'text' : 'password';
    });
  }
}
