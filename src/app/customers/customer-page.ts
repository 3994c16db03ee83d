import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';

import type { CustomerJson } from '../../../shared/api/customers';
import { apiErrorMessage } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { loadEach } from '../ui/load';
import { CustomerCylinders } from './customer-cylinders';
import { CustomerDetails } from './customer-details';
import { CustomerEraseDialog } from './customer-erase-dialog';
import { CustomerJobs } from './customer-jobs';
import { CustomerMergeDialog, type MergeChoice } from './customer-merge-dialog';
import { CustomersApi } from './customers-api';
import { ShopDatePipe } from '../core/shop-date-pipe';

/**
 * One customer: contact details (edited in place), their jobs and their cylinders; the owner may
 * merge a duplicate record into this one, export everything held, or erase it on request.
 */
@Component({
  selector: 'app-customer-page',
  imports: [
    ShopDatePipe,
    CustomerCylinders,
    CustomerDetails,
    CustomerJobs,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    RouterLink,
  ],
  templateUrl: './customer-page.html',
  styleUrl: './customer-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CustomerPage {
  private readonly api = inject(CustomersApi);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  /** From the route: /customers/:id. */
  readonly id = input.required<string>();

  protected readonly customer = loadEach(this.id, (id) => this.api.get(id));
  protected readonly cylinders = loadEach(this.id, (id) => this.api.cylinders(id));
  /** The record as changed here (an edit, a merge), until the next load. */
  private readonly changed = signal<CustomerJson | null>(null);
  protected readonly shown = computed(() => {
    const loaded = this.customer.value();
    const changed = this.changed();
    return changed && changed.id === loaded?.id ? changed : loaded;
  });
  protected readonly canMerge = computed(() => this.session.may('mergeCustomers'));
  protected readonly canEdit = computed(() => this.session.may('runCounter'));
  protected readonly busy = signal(false);

  protected exportUrl(format: 'json' | 'csv'): string {
    return this.api.exportUrl(this.id(), format);
  }

  protected edited(customer: CustomerJson): void {
    this.changed.set(customer);
  }

  protected merge(): void {
    const into = this.shown();
    if (!into) return;
    this.dialog
      .open<CustomerMergeDialog, CustomerJson, MergeChoice | undefined>(CustomerMergeDialog, {
        data: into,
        width: '560px',
        autoFocus: 'first-tabbable',
      })
      .afterClosed()
      .subscribe((choice) => {
        if (!choice) return;
        this.busy.set(true);
        this.api.merge(into.id, choice.from.id).subscribe({
          next: (merged) => {
            this.busy.set(false);
            this.changed.set(merged);
            this.cylinders.reload();
            void this.notifier.success(`${choice.from.name} merged into ${merged.name}.`);
          },
          error: (error: unknown) => {
            this.busy.set(false);
            void this.notifier.error(`Not merged: ${apiErrorMessage(error)}`);
          },
        });
      });
  }

  protected erase(): void {
    const customer = this.shown();
    if (!customer) return;
    this.dialog
      .open<CustomerEraseDialog, CustomerJson, boolean>(CustomerEraseDialog, {
        data: customer,
        width: '560px',
        autoFocus: 'first-tabbable',
      })
      .afterClosed()
      .subscribe((confirmed) => {
        if (!confirmed) return;
        this.busy.set(true);
        this.api.erase(customer.id).subscribe({
          next: (erased) => {
            this.busy.set(false);
            this.changed.set(erased);
            void this.notifier.success('The customer’s name and contact details are erased.');
          },
          error: (error: unknown) => {
            this.busy.set(false);
            void this.notifier.error(`Not erased: ${apiErrorMessage(error)}`);
          },
        });
      });
  }
}
