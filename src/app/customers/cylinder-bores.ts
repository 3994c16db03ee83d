import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { RouterLink } from '@angular/router';

import type { BoreJson } from '../../../shared/api/customers';
import { LengthPipe } from '../core/length-pipe';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { DataTable } from '../ui/data-table';
import { TableColumn } from '../ui/table-column';

/** Every bore of one cylinder, oldest first: when, on which job, the step, the bore, the piston. */
@Component({
  selector: 'app-cylinder-bores',
  imports: [DataTable, LengthPipe, RouterLink, ShopDatePipe, TableColumn],
  template: `
    <app-data-table
      caption="Every bore of this cylinder, oldest first"
      regionLabel="Table: bores"
      [rows]="bores()"
      [columns]="columns"
    >
      <ng-template tableColumn="date" header="Date" cellClass="nowrap" let-b>
        {{ b.date | shopDate }}
      </ng-template>
      <ng-template tableColumn="job" header="Job" cellClass="nowrap" let-b>
        <a [routerLink]="['/jobs', b.jobId]">{{ b.jobNumber }}</a>
        <span class="muted">· cyl. {{ b.n }}</span>
      </ng-template>
      <ng-template tableColumn="step" header="Step" let-b>{{ b.stepLabel ?? '—' }}</ng-template>
      <ng-template tableColumn="bore" header="Finished bore" num let-b>
        {{ b.finishedBore | length }}
        <span class="muted small">{{ b.measured ? 'measured after honing' : "step's size" }}</span>
      </ng-template>
      <ng-template tableColumn="piston" header="Piston" let-b>{{ b.piston ?? '—' }}</ng-template>
    </app-data-table>
  `,
  styles: `
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
