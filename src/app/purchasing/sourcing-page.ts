import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDatepickerModule } from '@angular/material/datepicker';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import type { DateTime } from 'luxon';
import { catchError, map, of, tap } from 'rxjs';

import type { LadderStepJson } from '../../../shared/api/catalog';
import { dayOf } from '../core/shop-date-adapter';
import { DataTable } from '../ui/data-table';
import { loadEach } from '../ui/load';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { PurchasingApi } from './purchasing-api';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { FormAlert } from '../ui/form-alert';

/**
 * Who still has a part, or the pistons of a family's step: every supplier's offer landed here in
 * the home currency, how fresh the information is, the best offer for a needed-by date, and a flag
 * when the step is scarce.
 */
@Component({
  selector: 'app-sourcing-page',
  imports: [
    FormAlert,
    ShopDatePipe,
    FormsModule,
    MatButtonModule,
    MatDatepickerModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    DataTable,
    TableColumn,
    TableEmpty,
    RouterLink,
  ],
  templateUrl: './sourcing-page.html',
  styleUrl: './sourcing-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SourcingPage {
  private readonly api = inject(PurchasingApi);
  private readonly router = inject(Router);

  /** From the address: ?partId=… or ?familyId=…&stepId=…, with ?quantity and ?neededBy. */
  readonly partId = input<string>();
  readonly familyId = input<string>();
  readonly stepId = input<string>();
  readonly quantity = input<string>();
  readonly neededBy = input<string>();

  protected readonly columns = ['supplier', 'price', 'landed', 'available', 'lead', 'seen'];
  protected readonly families = toSignal(
    this.api.families().pipe(
      map((p) => p.items),
      catchError(() => of([])),
    ),
    { initialValue: [] },
  );
  protected readonly steps = signal<LadderStepJson[]>([]);
  protected chosenFamily = '';
  protected chosenStep = '';
  protected wanted = 1;
  protected byDate = '';
  protected day(value: DateTime | null): string {
    return dayOf(value) ?? '';
  }

  /** The offers for what the address asks about: a part, or a family's step; none until given. */
  protected readonly offers = loadEach(
    () => {
      const partId = this.partId();
      const familyId = this.familyId();
      const stepId = this.stepId();
      if (!partId && !(familyId && stepId)) return null;
      return {
        ...(partId ? { partId } : { familyId, stepId }),
        quantity: Math.max(1, Number(this.quantity() ?? 1) || 1),
        neededBy: this.neededBy() || undefined,
      };
    },
    (q) =>
      this.api.sourcing(q).pipe(
        tap((r) => {
          // Opened for one part (from Reorder): show its family and step, so the form says what
          // is being looked at and Find can be pressed again.
          if (r.part?.familyId && !this.chosenFamily) {
            this.chosenFamily = r.part.familyId;
            this.chosenStep = r.part.stepId ?? '';
            this.loadSteps(r.part.familyId);
          }
        }),
      ),
  );

  constructor() {
    // The form shows what the address asks for.
    effect(() => {
      const familyId = this.familyId();
      const stepId = this.stepId();
      this.wanted = Math.max(1, Number(this.quantity() ?? 1) || 1);
      this.byDate = this.neededBy() ?? '';
      if (familyId) {
        this.chosenFamily = familyId;
        this.chosenStep = stepId ?? '';
        this.loadSteps(familyId);
      }
    });
  }

  protected loadSteps(familyId: string): void {
    this.steps.set([]);
    if (!familyId) return;
    this.api.ladder(familyId).subscribe({
      next: (ladder) => this.steps.set(ladder.steps),
      error: () => this.steps.set([]),
    });
  }

  protected onFamily(familyId: string): void {
    this.chosenFamily = familyId;
    this.chosenStep = '';
    this.loadSteps(familyId);
  }

  /** Find works for the part carried over from Reorder, or for the family and step chosen. */
  protected canFind(): boolean {
    return Boolean(this.partId()) || Boolean(this.chosenFamily && this.chosenStep);
  }

  /** Puts the choice in the address, so the page can be bookmarked and the back button works. */
  protected look(): void {
    const part = this.offers.value()?.part;
    const samePart =
      part &&
      this.partId() === part.id &&
      (part.familyId ?? '') === this.chosenFamily &&
      (part.stepId ?? '') === this.chosenStep;
    // The family and step are still the part's own: look again for that part (a ring set or kit
    // is not one of the step's pistons, so a step search would show something else).
    if (samePart || (this.partId() && !this.chosenFamily)) {
      this.refine();
      return;
    }
    if (!this.chosenFamily || !this.chosenStep) return;
    void this.router.navigate([], {
      queryParams: {
        familyId: this.chosenFamily,
        stepId: this.chosenStep,
        quantity: this.wanted,
        neededBy: this.byDate || null,
        partId: null,
      },
    });
  }

  protected refine(): void {
    void this.router.navigate([], {
      queryParams: { quantity: this.wanted, neededBy: this.byDate || null },
      queryParamsHandling: 'merge',
    });
  }
}
