import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule, type MatMenuPanel } from '@angular/material/menu';
import { MatTooltipModule } from '@angular/material/tooltip';

/**
 * The button at the end of a table row that opens the page's menu for that row, named for the row:
 * `<app-row-menu [menu]="menu" [data]="{ u }" [label]="'Actions for ' + u.label" />`, with one
 * `<mat-menu #menu>` on the page whose `matMenuContent` template reads the row from `data`.
 */
@Component({
  selector: 'app-row-menu',
  imports: [MatButtonModule, MatIconModule, MatMenuModule, MatTooltipModule],
  template: `
    <button
      mat-icon-button
      type="button"
      [matMenuTriggerFor]="menu()"
      [matMenuTriggerData]="data()"
      [attr.aria-label]="label()"
      [matTooltip]="label()"
    >
      <mat-icon>more_vert</mat-icon>
    </button>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RowMenu {
  readonly menu = input.required<MatMenuPanel>();
  /** What the menu's template gets for this row. */
  readonly data = input.required<unknown>();
  /** The button's name and tooltip, e.g. "More for Ines Harrowgate". */
  readonly label = input.required<string>();
}
