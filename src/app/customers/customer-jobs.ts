import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';

import type { CustomerJobJson, CustomerJobMoneyJson } from '../../../shared/api/customers';
import { ESTIMATE_STATE_LABELS } from '../../../shared/api/money';
import { JOB_STATE_LABELS } from '../../../shared/api/jobs';
import { formatMoney } from '../../../shared/money';
import { ShopDatePipe } from '../core/shop-date-pipe';

/** A customer's jobs, newest first: where each stands, its dates and what it comes to. */
@Component({
  selector: 'app-customer-jobs',
  imports: [ShopDatePipe, MatTableModule, RouterLink],
  template: `
    <section aria-labelledby="jobs-title">
      <h2 id="jobs-title">Jobs ({{ jobs().length }})</h2>
      @if (jobs().length === 0) {
        <p class="muted">No jobs yet.</p>
      } @else {
        <div class="table-scroll" tabindex="0" role="region" aria-label="Table: jobs">
          <table mat-table [dataSource]="jobs()">
            <caption class="visually-hidden">
              The customer's jobs
            </caption>
            <ng-container matColumnDef="number">
              <th mat-header-cell *matHeaderCellDef scope="col">Job</th>
              <td mat-cell *matCellDef="let j" class="nowrap">
                <a class="strong" [routerLink]="['/jobs', j.id]">{{ j.number }}</a>
              </td>
            </ng-container>
            <ng-container matColumnDef="work">
              <th mat-header-cell *matHeaderCellDef scope="col">Engine · work</th>
              <td mat-cell *matCellDef="let j">
                {{ j.familyCode }} · {{ j.cylinders }} cyl.
                @if (j.askedFor) {
                  <span class="muted">· {{ j.askedFor }}</span>
                }
              </td>
            </ng-container>
            <ng-container matColumnDef="state">
              <th mat-header-cell *matHeaderCellDef scope="col">Stage</th>
              <td mat-cell *matCellDef="let j">{{ stateLabel(j) }}</td>
            </ng-container>
            <ng-container matColumnDef="dates">
              <th mat-header-cell *matHeaderCellDef scope="col">In · wanted · closed</th>
              <td mat-cell *matCellDef="let j" class="nowrap">
                {{ j.createdAt | shopDate }} · {{ j.dueDate ? (j.dueDate | shopDate) : '—' }} ·
                {{ j.closedAt ? (j.closedAt | shopDate) : '—' }}
              </td>
            </ng-container>
            <ng-container matColumnDef="total">
              <th mat-header-cell *matHeaderCellDef scope="col" class="num">Estimate</th>
              <td mat-cell *matCellDef="let j" class="num">
                @if (j.money; as m) {
                  @if (m.total !== undefined) {
                    {{ money(m.total, m.currency) }}
                  }
                  <span class="muted small">{{ estimateLabel(m) }}</span>
                } @else {
                  <span class="muted">not priced</span>
                }
              </td>
            </ng-container>
            <tr mat-header-row *matHeaderRowDef="columns"></tr>
            <tr mat-row *matRowDef="let row; columns: columns"></tr>
          </table>
        </div>
      }
    </section>
  `,
  styles: `
    .nowrap {
      white-space: nowrap;
    }
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
