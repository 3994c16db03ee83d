import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';

/**
 * The change and remove buttons at the end of a table row, named for what they act on:
 * `<app-row-actions [what]="'the ' + r.currency + ' rate'" (edit)="edit(r)" (remove)="remove(r)" />`
 * reads "Change the USD rate" and "Remove the USD rate" to a screen reader and in the tooltip.
 */
@Component({
  selector: 'app-row-actions',
  imports: [MatButtonModule, MatIconModule, MatTooltipModule],
  template: `
    <button
      mat-icon-button
      type="button"
      (click)="edit.emit()"
      [attr.aria-label]="'Change ' + what()"
      [matTooltip]="'Change ' + what()"
    >
      <mat-icon>edit</mat-icon>
    </button>
    <button
      mat-icon-button
      type="button"
      (click)="remove.emit()"
      [attr.aria-label]="'Remove ' + what()"
      [matTooltip]="'Remove ' + what()"
    >
      <mat-icon>delete</mat-icon>
    </button>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RowActions {
  /** What the row is, as the buttons' names end: "the USD rate", "the default for +0.50". */
  readonly what = input.required<string>();
  readonly edit = output<void>();
  readonly remove = output<void>();
}
