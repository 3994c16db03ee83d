import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

import type { CustomerCylinderJson } from '../../../shared/api/customers';
import { LengthPipe } from '../core/length-pipe';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { DataTable } from '../ui/data-table';
import { TableColumn } from '../ui/table-column';

/** The customer's cylinders under the shop's marks: bores so far and the steps they have left. */
@Component({
  selector: 'app-customer-cylinders',
  imports: [
    DataTable,
    LengthPipe,
    MatButtonModule,
    MatIconModule,
    RouterLink,
    ShopDatePipe,
    TableColumn,
  ],
  template: `
    <section aria-labelledby="cylinders-title">
      <h2 id="cylinders-title">Cylinders ({{ cylinders().length }})</h2>
      @if (error()) {
        <div class="form-alert" role="alert">
          <mat-icon>error</mat-icon>
          <span class="grow">{{ error() }}</span>
          <button mat-button type="button" (click)="retry.emit()">Try again</button>
        </div>
      } @else if (!loading() && cylinders().length === 0) {
        <p class="muted">
          No cylinder marked yet. Cylinders are added under the shop's mark when a job is taken in.
        </p>
      } @else {
        <app-data-table
          caption="The customer's cylinders"
          regionLabel="Table: cylinders"
          [rows]="cylinders()"
          [columns]="columns"
        >
          <ng-template tableColumn="mark" header="Shop's mark" cellClass="nowrap" let-c>
            <a class="strong" [routerLink]="['/customers', customerId(), 'cylinders', c.id]">{{
              c.mark
            }}</a>
            @if (c.castNumber) {
              <span class="muted">· cast {{ c.castNumber }}</span>
            }
          </ng-template>
          <ng-template tableColumn="family" header="Family" let-c>{{ c.familyCode }}</ng-template>
          <ng-template tableColumn="bores" header="Bores" num let-c>{{
            c.bores.length
          }}</ng-template>
          <ng-template tableColumn="last" header="Last bore" let-c>
            @if (c.bores.at(-1); as b) {
              {{ b.stepLabel ?? '—' }} · {{ b.finishedBore | length }} · {{ b.date | shopDate }}
            } @else {
              <span class="muted">never bored here</span>
            }
          </ng-template>
          <ng-template tableColumn="left" header="Steps left" num let-c>
            <span [class.last]="c.stepsLeft <= 1">
              {{ c.stepsLeft }}
              @if (c.stepsLeft === 0) {
                <span class="small">sleeve next</span>
              } @else if (c.stepsLeft === 1) {
                <span class="small">one left</span>
              }
            </span>
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
    .last {
      color: var(--mat-sys-error);
      font-weight: 600;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CustomerCylinders {
  readonly customerId = input.required<string>();
  readonly cylinders = input.required<CustomerCylinderJson[]>();
  readonly loading = input(false);
  readonly error = input('');
  readonly retry = output<void>();

  protected readonly columns = ['mark', 'family', 'bores', 'last', 'left'];
}
