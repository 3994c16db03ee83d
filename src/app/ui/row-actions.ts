import { booleanAttribute, ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';

/**
 * The change and remove buttons at the end of a table row, named for what they act on:
 * `<app-row-actions [what]="'the ' + r.currency + ' rate'" (edit)="edit(r)" (remove)="remove(r)" />`
 * reads "Change the USD rate" and "Remove the USD rate" to a screen reader and in the tooltip.
 * `[editable]="false"` or `[removable]="false"` leaves one of them out; `[disabled]` holds both.
 */
@Component({
  selector: 'app-row-actions',
  imports: [MatButtonModule, MatIconModule, MatTooltipModule],
  template: `
    @if (editable()) {
      <button
        mat-icon-button
        type="button"
        [disabled]="disabled()"
        (click)="edit.emit()"
        [attr.aria-label]="'Change ' + what()"
        [matTooltip]="'Change ' + what()"
      >
        <mat-icon>edit</mat-icon>
      </button>
    }
    @if (removable()) {
      <button
        mat-icon-button
        type="button"
        [disabled]="disabled()"
        (click)="remove.emit()"
        [attr.aria-label]="'Remove ' + what()"
        [matTooltip]="'Remove ' + what()"
      >
        <mat-icon>delete</mat-icon>
      </button>
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RowActions {
  /** What the row is, as the buttons' names end: "the USD rate", "the default for +0.50". */
  readonly what = input.required<string>();
  /** Both buttons wait, while the row's last change is still being saved. */
  readonly disabled = input(false, { transform: booleanAttribute });
  /** False for a row that may only be removed (an estimate's discount line). */
  readonly editable = input(true);
  /** False for a row that may only be changed (a labour operation is switched off, not removed). */
  readonly removable = input(true);
  readonly edit = output<void>();
  readonly remove = output<void>();
}
