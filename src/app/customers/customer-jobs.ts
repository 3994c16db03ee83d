import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { RouterLink } from '@angular/router';

import type { CustomerJobJson, CustomerJobMoneyJson } from '../../../shared/api/customers';
import { ESTIMATE_STATE_LABELS } from '../../../shared/api/money';
import { JOB_STATE_LABELS } from '../../../shared/api/jobs';
import { formatMoney } from '../../../shared/money';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { DataTable } from '../ui/data-table';
import { TableColumn } from '../ui/table-column';

/** A customer's jobs, newest first: where each stands, its dates and what it comes to. */
@Component({
  selector: 'app-customer-jobs',
  imports: [DataTable, RouterLink, ShopDatePipe, TableColumn],
  template: `
    <section aria-labelledby="jobs-title">
      <h2 id="jobs-title">Jobs ({{ jobs().length }})</h2>
      @if (jobs().length === 0) {
        <p class="muted">No jobs yet.</p>
      } @else {
        <app-data-table
          caption="The customer's jobs"
          regionLabel="Table: jobs"
          [rows]="jobs()"
          [columns]="columns"
        >
          <ng-template tableColumn="number" header="Job" cellClass="nowrap" let-j>
            <a class="strong" [routerLink]="['/jobs', j.id]">{{ j.number }}</a>
          </ng-template>
          <ng-template tableColumn="work" header="Engine · work" let-j>
            {{ j.familyCode }} · {{ j.cylinders }} cyl.
            @if (j.askedFor) {
              <span class="muted">· {{ j.askedFor }}</span>
            }
          </ng-template>
          <ng-template tableColumn="state" header="Stage" let-j>{{ stateLabel(j) }}</ng-template>
          <ng-template tableColumn="dates" header="In · wanted · closed" cellClass="nowrap" let-j>
            {{ j.createdAt | shopDate }} · {{ j.dueDate ? (j.dueDate | shopDate) : '—' }} ·
            {{ j.closedAt ? (j.closedAt | shopDate) : '—' }}
          </ng-template>
          <ng-template tableColumn="total" header="Estimate" num let-j>
            @if (j.money; as m) {
              @if (m.total !== undefined) {
                {{ money(m.total, m.currency) }}
              }
              <span class="muted small">{{ estimateLabel(m) }}</span>
            } @else {
              <span class="muted">not priced</span>
            }
          </ng-template>
        </app-data-table>
      }
    </section>
  `,
  styles: `
    h2 {
      margin: 0 0 8px;
      font: var(--mat-sys-title-medium);
    }
    .small {
      display: block;
      font: var(--mat-sys-body-small);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CustomerJobs {
  readonly jobs = input.required<CustomerJobJson[]>();

  protected readonly columns = ['number', 'work', 'state', 'dates', 'total'];
  protected readonly money = formatMoney;

  protected stateLabel(job: CustomerJobJson): string {
    return JOB_STATE_LABELS[job.state];
  }

  protected estimateLabel(money: CustomerJobMoneyJson): string {
    return ESTIMATE_STATE_LABELS[money.estimateState];
  }
}
