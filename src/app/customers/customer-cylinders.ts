import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';

import type { CustomerCylinderJson } from '../../../shared/api/customers';
import { LengthPipe } from '../core/length-pipe';
import { ShopDatePipe } from '../core/shop-date-pipe';

/** The customer's cylinders under the shop's marks: bores so far and the steps they have left. */
@Component({
  selector: 'app-customer-cylinders',
  imports: [ShopDatePipe, LengthPipe, MatButtonModule, MatIconModule, MatTableModule, RouterLink],
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
        <div class="table-scroll" tabindex="0" role="region" aria-label="Table: cylinders">
          <table mat-table [dataSource]="cylinders()">
            <caption class="visually-hidden">
              The customer's cylinders
            </caption>
            <ng-container matColumnDef="mark">
              <th mat-header-cell *matHeaderCellDef scope="col">Shop's mark</th>
              <td mat-cell *matCellDef="let c" class="nowrap">
                <a class="strong" [routerLink]="['/customers', customerId(), 'cylinders', c.id]">{{
                  c.mark
                }}</a>
                @if (c.castNumber) {
                  <span class="muted">· cast {{ c.castNumber }}</span>
                }
              </td>
            </ng-container>
            <ng-container matColumnDef="family">
              <th mat-header-cell *matHeaderCellDef scope="col">Family</th>
              <td mat-cell *matCellDef="let c">{{ c.familyCode }}</td>
            </ng-container>
            <ng-container matColumnDef="bores">
              <th mat-header-cell *matHeaderCellDef scope="col" class="num">Bores</th>
              <td mat-cell *matCellDef="let c" class="num">{{ c.bores.length }}</td>
            </ng-container>
            <ng-container matColumnDef="last">
              <th mat-header-cell *matHeaderCellDef scope="col">Last bore</th>
              <td mat-cell *matCellDef="let c">
                @if (c.bores.at(-1); as b) {
                  {{ b.stepLabel ?? '—' }} · {{ b.finishedBore | length }} · {{ b.date | shopDate }}
                } @else {
                  <span class="muted">never bored here</span>
                }
              </td>
            </ng-container>
            <ng-container matColumnDef="left">
              <th mat-header-cell *matHeaderCellDef scope="col" class="num">Steps left</th>
              <td mat-cell *matCellDef="let c" class="num" [class.last]="c.stepsLeft <= 1">
                {{ c.stepsLeft }}
                @if (c.stepsLeft === 0) {
                  <span class="small">sleeve next</span>
                } @else if (c.stepsLeft === 1) {
                  <span class="small">one left</span>
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
