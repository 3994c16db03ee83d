import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';

import type { CustomerJson, CustomerListItemJson } from '../../../shared/api/customers';
import { CustomerSearch } from './customer-search';

export interface MergeChoice {
  from: CustomerListItemJson;
}

/**
 * Picks the duplicate record to fold into this customer, then says what happens before it does:
 * every job and cylinder moves over, and the duplicate is gone.
 */
@Component({
  selector: 'app-customer-merge-dialog',
  imports: [CustomerSearch, MatButtonModule, MatDialogModule, MatIconModule],
  template: `
    <h2 mat-dialog-title>Merge a duplicate into {{ into.name }}</h2>
    <mat-dialog-content>
      @if (from(); as f) {
        <p>
          Every job and cylinder of <strong>{{ f.name }}</strong> ({{ f.phone ?? 'no phone' }} ·
          {{ f.email ?? 'no e-mail' }}) moves to <strong>{{ into.name }}</strong>, and the record of
          {{ f.name }} is removed. {{ into.name }}'s contact details stay as they are. The merge is
          written to the audit trail; it cannot be undone here.
        </p>
        <button mat-button type="button" (click)="from.set(null)">Pick another record</button>
      } @else {
        <p>Find the other record of the same person.</p>
        <app-customer-search
          label="The duplicate record"
          [excludeId]="into.id"
          (picked)="from.set($event)"
        />
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="undefined">Keep both</button>
      <button mat-flat-button type="button" [disabled]="!from()" (click)="confirm()">
        <mat-icon>merge</mat-icon>
        Merge into {{ into.name }}
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    app-customer-search {
      display: block;
      margin-top: 8px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CustomerMergeDialog {
  protected readonly into = inject<CustomerJson>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<CustomerMergeDialog, MergeChoice>>(MatDialogRef);
  protected readonly from = signal<CustomerListItemJson | null>(null);

  protected confirm(): void {
    const from = this.from();
    if (from) this.ref.close({ from });
  }
}
