import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';

import type { BoreJson } from '../../../shared/api/customers';
import { LengthPipe } from '../core/length-pipe';
import { ShopDatePipe } from '../core/shop-date-pipe';

/** Every bore of one cylinder, oldest first: when, on which job, the step, the bore, the piston. */
@Component({
  selector: 'app-cylinder-bores',
  imports: [ShopDatePipe, LengthPipe, MatTableModule, RouterLink],
  template: `
    <div class="table-scroll" tabindex="0" role="region" aria-label="Table: bores">
      <table mat-table [dataSource]="bores()">
        <caption class="visually-hidden">
          Every bore of this cylinder, oldest first
        </caption>
        <ng-container matColumnDef="date">
          <th mat-header-cell *matHeaderCellDef scope="col">Date</th>
          <td mat-cell *matCellDef="let b" class="nowrap">{{ b.date | shopDate }}</td>
        </ng-container>
        <ng-container matColumnDef="job">
          <th mat-header-cell *matHeaderCellDef scope="col">Job</th>
          <td mat-cell *matCellDef="let b" class="nowrap">
            <a [routerLink]="['/jobs', b.jobId]">{{ b.jobNumber }}</a>
            <span class="muted">· cyl. {{ b.n }}</span>
          </td>
        </ng-container>
        <ng-container matColumnDef="step">
          <th mat-header-cell *matHeaderCellDef scope="col">Step</th>
          <td mat-cell *matCellDef="let b">{{ b.stepLabel ?? '—' }}</td>
        </ng-container>
        <ng-container matColumnDef="bore">
          <th mat-header-cell *matHeaderCellDef scope="col" class="num">Finished bore</th>
          <td mat-cell *matCellDef="let b" class="num">
            {{ b.finishedBore | length }}
            <span class="muted small">{{
              b.measured ? 'measured after honing' : "step's size"
            }}</span>
          </td>
        </ng-container>
        <ng-container matColumnDef="piston">
          <th mat-header-cell *matHeaderCellDef scope="col">Piston</th>
          <td mat-cell *matCellDef="let b">{{ b.piston ?? '—' }}</td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let row; columns: columns"></tr>
      </table>
    </div>
  `,
  styles: `
    .nowrap {
      white-space: nowrap;
    }
    .small {
      display: block;
      font: var(--mat-sys-body-small);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CylinderBores {
  readonly bores = input.required<BoreJson[]>();
  protected readonly columns = ['date', 'job', 'step', 'bore', 'piston'];
}
