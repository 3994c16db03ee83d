import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { catchError, map, of } from 'rxjs';

import type { HoldJson, ProposalJson, ProposedUnitJson } from '../../../shared/api/jobs';
import { pistonCleanup } from '../../../shared/bore-sheet';
import { formatIn, formatMm, mmToNm, parseLength, toLengthJson } from '../../../shared/lengths';
import { apiErrorBody, apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Session } from '../core/session';
import { StockApi } from '../stock/stock-api';
import { CameraScanButton } from '../ui/camera-scan';
import { JobsApi } from './jobs-api';
import { FormAlert } from '../ui/form-alert';

export interface HoldDialogData {
  jobId: string;
  jobNumber: string;
  cylinder: number;
}

type Loaded = { ok: true; proposal: ProposalJson } | { ok: false; message: string };

/**
 * Sets a measured piston aside for one cylinder: Stepstock proposes the free one nearest the
 * step's size; a scanned or typed label picks another. A ring set of the step goes with it.
 * Closes with the piston's hold.
 */
@Component({
  selector: 'app-hold-dialog',
  imports: [
    FormAlert,
    CameraScanButton,
    LengthPipe,
    MatButtonModule,
    MatCheckboxModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
  ],
  templateUrl: './hold-dialog.html',
  styleUrl: './hold-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class HoldDialog {
  private readonly api = inject(JobsApi);
  private readonly dialogRef = inject<MatDialogRef<HoldDialog, HoldJson>>(MatDialogRef);
  protected readonly data = inject<HoldDialogData>(MAT_DIALOG_DATA);

  private readonly loaded = toSignal(
    this.api.proposal(this.data.jobId, this.data.cylinder).pipe(
      map((proposal): Loaded => ({ ok: true, proposal })),
      catchError((error: unknown) => of<Loaded>({ ok: false, message: apiErrorMessage(error) })),
    ),
  );
  protected readonly proposal = computed(() => {
    const loaded = this.loaded();
    return loaded?.ok ? loaded.proposal : null;
  });
  protected readonly loadError = computed(() => {
    const loaded = this.loaded();
    return loaded && !loaded.ok ? loaded.message : '';
  });

  /** The piston about to be held: the proposal, or one picked from the list or by label. */
  protected readonly picked = signal<ProposedUnitJson | null>(null);
  protected readonly choice = computed(() => this.picked() ?? this.proposal()?.unit ?? null);
  protected readonly ringSet = computed(
    () => this.proposal()?.rings.find((r) => r.free > 0) ?? null,
  );
  protected readonly withRings = signal(true);

  /**
   * Whether the bore cut for the chosen piston (its skirt + the clearance) cleans up the wear, worked
   * out with the same rule the server refuses a cut by; null before the bore is read.
   */
  protected readonly cleanup = computed(() => {
    const unit = this.choice();
    const basis = this.proposal()?.cleanupBasis;
    if (!unit || !basis) return null;
    const finished = mmToNm(unit.skirt.mm) + mmToNm(basis.clearance.mm);
    const check = pistonCleanup(finished, mmToNm(basis.largestWorn.mm), mmToNm(basis.allowance.mm));
    return {
      ...check,
      finished: toLengthJson(finished),
      short: toLengthJson(Math.max(0, -check.spareNm)),
    };
  });

  // Measuring the proposed piston here, before it is held: a skirt read at the bench just now beats
  // one recorded at delivery (a piston may have been swapped, mislabelled or measured in haste).
  private readonly stock = inject(StockApi);
  protected readonly unitName = inject(Session).unit;
  protected readonly skirtText = signal('');
  protected readonly measureError = signal('');
  /** Ids of the pistons measured in this dialog, so the choice can say so. */
  protected readonly measuredNow = signal<ReadonlySet<string>>(new Set());

  protected measureChoice(): void {
    const unit = this.choice();
    if (!unit || this.busy()) return;
    const parsed = parseLength(this.skirtText(), {
      defaultUnit: this.unitName(),
      max: 500_000_000,
    });
    if (!parsed.ok) {
      this.measureError.set(parsed.message);
      return;
    }
    this.measureError.set('');
    this.busy.set(true);
    // Sent exactly as read, in the unit it was typed in.
    const skirt = parsed.unit === 'in' ? `${formatIn(parsed.nm)} in` : `${formatMm(parsed.nm)} mm`;
    this.stock.measure(unit.id, skirt).subscribe({
      next: (change) => {
        this.busy.set(false);
        this.skirtText.set('');
        this.picked.set({ ...unit, skirt: change.unit?.skirt ?? toLengthJson(parsed.nm) });
        this.measuredNow.update((ids) => new Set([...ids, unit.id]));
      },
      error: (error: unknown) => {
        this.busy.set(false);
        // The reason once, in words, under the skirt field it is about.
        this.measureError.set(apiFieldErrors(error)['skirt'] ?? apiErrorMessage(error));
      },
    });
  }

  protected readonly label = signal('');
  protected readonly busy = signal(false);
  protected readonly problem = signal('');

  protected pick(unit: ProposedUnitJson): void {
    this.picked.set(unit);
    this.problem.set('');
  }

  /** A label read by the camera: found and checked as a typed one is. */
  protected onScanned(label: string): void {
    this.label.set(label);
    this.findLabel();
  }

  /** A label from the scanner (it types the label and Enter) or the keyboard. */
  protected findLabel(): void {
    const label = this.label().trim();
    if (!label || this.busy()) return;
    this.busy.set(true);
    this.problem.set('');
    this.api.unitByLabel(label).subscribe({
      next: (unit) => {
        this.busy.set(false);
        const step = this.proposal()?.step;
        if (unit.status !== 'free') {
          this.problem.set(`${unit.label} is not free (it is ${unit.status}).`);
        } else if (!unit.skirt) {
          this.problem.set(`${unit.label} has not been measured yet; measure its skirt first.`);
        } else if (step && unit.stepId !== step.id) {
          this.problem.set(
            `${unit.label} is a ${unit.stepLabel ?? 'different'} piston; this cylinder goes to ${step.label}.`,
          );
        } else {
          this.pick({
            id: unit.id,
            label: unit.label,
            partId: unit.partId,
            sku: unit.sku,
            skirt: unit.skirt,
            bin: unit.bin,
            stepLabel: unit.stepLabel,
          });
        }
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.problem.set(apiErrorMessage(error));
      },
    });
  }

  protected hold(): void {
    const unit = this.choice();
    if (!unit || this.busy()) return;
    this.busy.set(true);
    this.problem.set('');
    const cylinder = this.data.cylinder;
    const piston = this.api.hold(this.data.jobId, { cylinder, unitId: unit.id });
    const rings = this.ringSet();
    piston.subscribe({
      next: (held) => {
        if (!rings || !this.withRings()) {
          this.dialogRef.close(held);
          return;
        }
        // The piston is what matters; a ring set taken meanwhile is seen on the cylinder page.
        this.api.hold(this.data.jobId, { cylinder, partId: rings.partId, quantity: 1 }).subscribe({
          next: () => this.dialogRef.close(held),
          error: () => this.dialogRef.close(held),
        });
      },
      error: (error: unknown) => {
        this.busy.set(false);
        const body = apiErrorBody(error) as {
          error: { nextBest?: ProposedUnitJson | null };
        } | null;
        const next = body?.error.nextBest ?? null;
        this.problem.set(apiErrorMessage(error));
        if (next) this.picked.set(next);
      },
    });
  }
}
