import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';

import type { BoreJson } from '../../../shared/api/customers';
import type { EarlierBoreJson, RecommendationJson } from '../../../shared/api/jobs';
import { LengthPipe } from '../core/length-pipe';
import { CustomersApi } from '../customers/customers-api';
import { loadEach } from '../ui/load';
import { ShopDatePipe } from '../core/shop-date-pipe';

/**
 * At the bench, before any reading: which of the customer's cylinders this is, its bores before
 * this job and how many steps it has left, so a step it has already passed is never a surprise.
 * Once the step choice is in, its count (from the suggested step) replaces the cylinder's own.
 */
@Component({
  selector: 'app-cylinder-past',
  imports: [
    ShopDatePipe,
    LengthPipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatSelectModule,
    RouterLink,
  ],
  template: `
    @if (cylinder(); as cyl) {
      <div class="past" role="region" aria-label="This cylinder's earlier bores">
        <mat-icon aria-hidden="true">history</mat-icon>
        <div>
          <p>
            Cylinder
            <a [routerLink]="['/customers', customerId(), 'cylinders', cyl.id]">{{ cyl.mark }}</a>:
            @if (earlier(); as b) {
              bored {{ earlierCount() === 1 ? 'once' : earlierCount() + ' times' }} before, last to
              <strong>{{ b.stepLabel ?? 'no step' }}</strong> at
              <strong>{{ b.finishedBore | length }}</strong> on {{ b.date | shopDate }} (job
              <a [routerLink]="['/jobs', b.jobId]">{{ b.jobNumber }}</a>). Steps that would not
              clear that bore by the clean-up are refused.
            } @else if (detail.value()) {
              no earlier bore on record.
            } @else if (detail.error()) {
              its history could not be loaded ({{ detail.error() }}).
            }
          </p>
          @if (leftText(); as text) {
            <p class="left" [class.none]="leftCount() === 0">{{ text }}</p>
          }
        </div>
      </div>
    } @else {
      <div class="unlinked">
        <p class="hint">
          This job cylinder is not linked to one of the customer's marked cylinders, so no earlier
          bore is checked and this bore is not kept in a cylinder's history.
        </p>
        @if (editable() && known().length > 0) {
          <mat-form-field appearance="outline" subscriptSizing="dynamic">
            <mat-label>The customer's cylinder</mat-label>
            <mat-select [value]="pick()" (selectionChange)="pick.set($event.value)">
              @for (k of known(); track k.id) {
                <mat-option [value]="k.id">{{ k.mark }} ({{ k.bores.length }} bores)</mat-option>
              }
            </mat-select>
          </mat-form-field>
          <button mat-stroked-button type="button" [disabled]="!pick()" (click)="linkPicked()">
            <mat-icon>link</mat-icon>
            Link
          </button>
        }
      </div>
    }
  `,
  styles: `
    .past {
      display: flex;
      align-items: flex-start;
      gap: 8px;
      margin: 0 0 16px;
      padding: 8px 12px;
      border-radius: var(--mat-sys-corner-small);
      background: var(--mat-sys-surface-container);
    }
    p {
      margin: 0;
    }
    .left {
      margin-top: 4px;
      font-weight: 600;
    }
    .none {
      color: var(--mat-sys-error);
    }
    .unlinked {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 8px 16px;
      margin: 0 0 16px;
    }
    .hint {
      flex: 1 1 100%;
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CylinderPast {
  private readonly api = inject(CustomersApi);

  /** The job cylinder's link, as the job answers it. */
  readonly cylinder = input.required<{ id: string; mark: string } | null>();
  readonly customerId = input.required<string>();
  readonly jobId = input.required<string>();
  readonly familyId = input.required<string>();
  /** The job can still change: an unlinked cylinder may be linked here. */
  readonly editable = input(false);
  /** The step choice, once the bore is read. */
  readonly rec = input<RecommendationJson | null>(null);
  /** The customer's cylinder picked for this job cylinder. */
  readonly link = output<string>();

  protected readonly pick = signal<string | null>(null);
  /** The customer's cylinders of this family, offered only while unlinked. */
  private readonly offered = loadEach(
    computed(() => (!this.cylinder() && this.editable() ? this.customerId() : null)),
    (id) => this.api.cylinders(id),
  );
  protected readonly known = computed(() =>
    (this.offered.value() ?? []).filter((c) => c.familyId === this.familyId()),
  );

  protected linkPicked(): void {
    const id = this.pick();
    if (id) this.link.emit(id);
  }

  private readonly cylinderId = computed(() => this.cylinder()?.id ?? null);
  protected readonly detail = loadEach(this.cylinderId, (id) => this.api.cylinder(id));
  /** Bores from other jobs: this job's own cut is not an earlier bore. */
  private readonly before = computed<BoreJson[]>(() =>
    (this.detail.value()?.bores ?? []).filter((b) => b.jobId !== this.jobId()),
  );
  protected readonly earlierCount = computed(() => this.before().length);
  /** The step choice's own reading of the last bore when it is in, else the latest on record. */
  protected readonly earlier = computed<EarlierBoreJson | null>(() => {
    const fromRec = this.rec()?.earlierBore;
    if (fromRec) return fromRec;
    const last = this.before().at(-1);
    return last
      ? {
          jobId: last.jobId,
          jobNumber: last.jobNumber,
          date: last.date,
          stepLabel: last.stepLabel,
          finishedBore: last.finishedBore,
        }
      : null;
  });

  protected readonly leftCount = computed(() => {
    const rec = this.rec();
    if (rec) return rec.stepsLeft;
    const d = this.detail.value();
    return d && this.earlierCount() === d.bores.length ? d.stepsLeft : null;
  });
  protected readonly leftText = computed(() => {
    const n = this.leftCount();
    if (n === null) return '';
    const rec = this.rec();
    // The server counts from the suggested step (or, with none, from the earlier bore).
    const suggested = rec?.steps.find((s) => s.stepId === rec.choice);
    const after = suggested ? `after the suggested step (${suggested.label})` : 'for the next bore';
    if (n === 0) return `No step left ${after}: the next rebore needs a sleeve or a new cylinder.`;
    return `${n} step${n === 1 ? '' : 's'} left ${after}, up to the largest oversize.`;
  });
}
