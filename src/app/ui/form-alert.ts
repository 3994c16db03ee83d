import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/**
 * Why the last try failed, above (or below) the form it is about, read out at once; nothing while
 * there is nothing to say. The look is the app's `.form-alert`.
 */
@Component({
  selector: 'app-form-alert',
  imports: [MatIconModule],
  template: `
    @if (message()) {
      <div class="form-alert" role="alert">
        <mat-icon>error</mat-icon><span>{{ message() }}</span>
      </div>
    }
  `,
  // No box of its own: the alert sits in the form's layout as if written there.
  // (a host style, not an inline stylesheet: see ui/list-fields.ts on identical inline styles)
  host: { style: 'display: contents' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FormAlert {
  readonly message = input<string | null | undefined>('');
}
