import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';

import type { CustomerJson } from '../../../shared/api/customers';

/** Spells out what erasure removes and what it keeps before the owner confirms it. */
@Component({
  selector: 'app-customer-erase-dialog',
  imports: [MatButtonModule, MatDialogModule, MatIconModule],
  template: `
    <h2 mat-dialog-title>Erase {{ c.name }}?</h2>
    <mat-dialog-content>
      <p>Do this only when the customer has asked for it. Once erased:</p>
      <ul>
        <li>
          the name becomes an anonymous placeholder, and the phone, e-mail and notes are removed for
          good; nobody can find this customer by search any more;
        </li>
        <li>
          the {{ c.jobs.length }} job{{ c.jobs.length === 1 ? '' : 's' }}, their cylinders and
          bores, the stock movements and any money records stay, under the placeholder;
        </li>
        <li>the erasure is written to the audit trail (when and by whom, nothing personal).</li>
      </ul>
      <p>Export the customer's data first if they asked for a copy. Erasing cannot be undone.</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="false">Keep the customer</button>
      <button mat-flat-button type="button" class="danger" [mat-dialog-close]="true">
        <mat-icon>person_remove</mat-icon>
        Erase name and contact details
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    ul {
      margin: 0 0 12px;
      padding-left: 20px;
      line-height: 1.5;
    }
    .danger {
      --mat-button-filled-container-color: var(--mat-sys-error);
      --mat-button-filled-label-text-color: var(--mat-sys-on-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CustomerEraseDialog {
  protected readonly c = inject<CustomerJson>(MAT_DIALOG_DATA);
}
