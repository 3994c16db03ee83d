import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import {
  FormArray,
  FormControl,
  FormGroup,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  Validators,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import { catchError, map, of } from 'rxjs';

import { ShopDatePipe } from '../core/shop-date-pipe';
import type { PartDetailJson, PartJson } from '../../../shared/api/catalog';
import { formatLength, mmToNm, parseLength } from '../../../shared/lengths';
import type { OpenLineJson } from '../../../shared/api/purchasing';
import {
  MAX_PISTONS_PER_RECEIPT,
  type BinJson,
  type DeskReceiptJson,
} from '../../../shared/api/stock';
import { formatMoney } from '../../../shared/money';
import { apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { placeApiErrors } from '../core/field-errors';
import { LengthPipe } from '../core/length-pipe';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { lengthText, lengthValidator, otherUnitHint } from '../ui/length-input';
import { PartPicker } from './part-picker';
import { StockApi } from './stock-api';
import { FormAlert } from '../ui/form-alert';

type UnitRow = FormGroup<{ skirt: FormControl<string>; toMeasure: FormControl<boolean> }>;

/** Half a millimetre off the step's bore is worth a second look before saving (our own threshold). */
const LOOK_AGAIN_NM = 500_000;

/** "Not on any order" in the choice of what a delivery is. */
const NO_ORDER = '';

/**
 * The one receiving page. Takes a delivery in: which part, then the open order lines for it first
 * (receiving against one moves the order on, at the order's price), how many, which bin (the
 * part's usual one to start with), the unit cost when nobody ordered it, and for pistons each
 * one's measured skirt in the person's unit (or "to measure"). Then prints the labels.
 */
@Component({
  selector: 'app-receive-page',
  imports: [
    FormAlert,
    ShopDatePipe,
    LengthPipe,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatRadioModule,
    MatSelectModule,
    PartPicker,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './receive-page.html',
  styleUrl: './receive-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReceivePage {
  private readonly api = inject(StockApi);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);
  private readonly fb = inject(NonNullableFormBuilder);

  /** A part to start with, from the address (?partId=…). */
  readonly partId = input<string>();

  protected readonly unit = this.session.unit;
  /** Stock is valued in the shop's home currency. */
  protected money(amount: string): string {
    return formatMoney(amount, this.session.currency());
  }
  protected readonly part = signal<PartDetailJson | null>(null);
  protected readonly partLoading = signal(false);
  protected readonly isPiston = computed(() => this.part()?.kind === 'piston');

  protected readonly bins = toSignal(
    this.api.bins({ page: 1, pageSize: 500 }).pipe(
      map((page) => page.items),
      catchError(() => of<BinJson[]>([])),
    ),
    { initialValue: [] as BinJson[] },
  );

  protected readonly form = this.fb.group({
    quantity: this.fb.control(1, [Validators.required, Validators.min(1), Validators.max(10000)]),
    binId: ['', Validators.required],
    unitCost: ['', [Validators.required, Validators.pattern(/^\d{1,10}(\.\d{1,4})?$/)]],
    note: ['', Validators.maxLength(500)],
    units: new FormArray<UnitRow>([]),
  });

  protected readonly busy = signal(false);
  protected readonly problem = signal('');
  protected readonly serverErrors = signal<Record<string, string>>({});
  protected readonly done = signal<DeskReceiptJson | null>(null);
  /** Open order lines for the part, oldest expected first; the first is chosen to start with. */
  protected readonly openLines = signal<OpenLineJson[]>([]);
  protected readonly lineChoice = signal<string>(NO_ORDER);
  protected readonly chosenLine = computed(
    () => this.openLines().find((l) => l.line.id === this.lineChoice()) ?? null,
  );
  protected readonly noOrder = NO_ORDER;
  protected readonly receivedCount = computed(
    () => this.done()?.ledger.reduce((sum, row) => sum + row.quantity, 0) ?? 0,
  );
  protected readonly maxPistons = MAX_PISTONS_PER_RECEIPT;

  constructor() {
    effect(() => {
      const id = this.partId();
      if (id) this.loadPart(id);
    });
    this.form.controls.quantity.valueChanges.subscribe(() => this.sizeUnits());
  }

  protected pick(part: PartJson): void {
    this.loadPart(part.id);
  }

  protected clearPart(): void {
    this.part.set(null);
    this.openLines.set([]);
    this.choose(NO_ORDER);
    this.form.controls.units.clear();
  }

  /** Against an order line the order's price is the cost; with none, the cost paid is asked. */
  protected choose(lineId: string): void {
    this.lineChoice.set(lineId);
    const cost = this.form.controls.unitCost;
    const line = this.openLines().find((l) => l.line.id === lineId);
    if (line) {
      cost.disable();
      this.form.controls.quantity.setValue(line.line.open);
    } else {
      cost.enable();
    }
  }

  private loadLines(partId: string): void {
    this.openLines.set([]);
    this.choose(NO_ORDER);
    this.api.openLinesForPart(partId).subscribe({
      next: (found) => {
        if (this.part()?.id !== partId) return;
        this.openLines.set(found.items);
        this.choose(found.items[0]?.line.id ?? NO_ORDER);
      },
      // Without the list the page still receives as a delivery nobody ordered; say why.
      error: (error: unknown) =>
        this.problem.set(`The open orders could not be read: ${apiErrorMessage(error)}`),
    });
  }

  private loadPart(id: string): void {
    this.partLoading.set(true);
    this.problem.set('');
    this.api.part(id).subscribe({
      next: (part) => {
        this.partLoading.set(false);
        if (part.kind === 'kit') {
          this.problem.set(`${part.sku} is a kit: receive the parts in it one by one.`);
          return;
        }
        this.part.set(part);
        this.done.set(null);
        // The part's usual bin to start with; the person may choose another.
        if (part.binId) this.form.controls.binId.setValue(part.binId);
        this.loadLines(part.id);
        if (
          !this.form.controls.unitCost.value &&
          part.averageCost &&
          Number(part.averageCost) > 0
        ) {
          this.form.controls.unitCost.setValue(part.averageCost);
        }
        this.sizeUnits();
      },
      error: (error: unknown) => {
        this.partLoading.set(false);
        this.problem.set(apiErrorMessage(error));
      },
    });
  }

  /** One skirt field per piston, kept in step with the quantity. */
  private sizeUnits(): void {
    const units = this.form.controls.units;
    const wanted = this.isPiston()
      ? Math.max(
          0,
          Math.min(
            MAX_PISTONS_PER_RECEIPT,
            Math.floor(Number(this.form.controls.quantity.value) || 0),
          ),
        )
      : 0;
    while (units.length > wanted) units.removeAt(units.length - 1);
    while (units.length < wanted) {
      const row: UnitRow = this.fb.group({
        skirt: [
          '',
          [Validators.required, lengthValidator(() => this.unit(), { max: 500_000_000 })],
        ],
        toMeasure: [false],
      });
      row.controls.toMeasure.valueChanges.subscribe((later) => {
        if (later) row.controls.skirt.disable();
        else row.controls.skirt.enable();
      });
      units.push(row);
    }
  }

  protected skirtHint(index: number): string {
    const control = this.form.controls.units.at(index).controls.skirt;
    const text = control.value;
    const other = otherUnitHint(text, this.unit());
    const bore = this.part()?.step?.nominalBore;
    if (!other || !bore) return other;
    const parsed = parseLength(text, { defaultUnit: this.unit() });
    if (parsed.ok && Math.abs(parsed.nm - mmToNm(bore.mm)) > LOOK_AGAIN_NM) {
      return `${other} — far from this step's ${formatLength(mmToNm(bore.mm), this.unit())} bore: check the unit`;
    }
    return other;
  }

  protected skirtError(index: number): string {
    const control = this.form.controls.units.at(index).controls.skirt;
    if (control.hasError('required')) return 'Type the measured skirt, or tick “to measure”.';
    if (control.hasError('length')) return String(control.getError('length'));
    return this.serverErrors()[`units.${index}.skirt`] ?? '';
  }

  protected submit(): void {
    const part = this.part();
    if (this.busy() || !part) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const v = this.form.getRawValue();
    const unit = this.unit();
    const line = this.chosenLine();
    this.busy.set(true);
    this.problem.set('');
    this.serverErrors.set({});
    this.api
      .receive({
        partId: part.id,
        quantity: Number(v.quantity),
        binId: v.binId,
        ...(line ? { orderLineId: line.line.id } : { unitCost: v.unitCost.trim() }),
        note: v.note.trim() || undefined,
        units:
          part.kind === 'piston'
            ? v.units.map((u) => ({ skirt: u.toMeasure ? null : lengthText(u.skirt, unit) }))
            : undefined,
      })
      .subscribe({
        next: (receipt) => {
          this.busy.set(false);
          this.done.set(receipt);
          this.notifier.success(
            `${v.quantity} × ${part.sku} received${receipt.order ? ` against ${receipt.order.number}` : ''}; ${receipt.levels.onHand} on hand.`,
          );
        },
        error: (error: unknown) => {
          this.busy.set(false);
          this.serverErrors.set(apiFieldErrors(error));
          // Each reason once, under its own field; only what no field shows stays above the form.
          this.problem.set(placeApiErrors(this.form, error));
        },
      });
  }

  /** Ready for the next delivery of the same part: the count and sizes go, bin and cost stay. */
  protected another(): void {
    this.done.set(null);
    this.form.controls.quantity.setValue(1);
    this.form.controls.note.setValue('');
    this.form.controls.units.clear();
    this.sizeUnits();
    const part = this.part();
    if (part) this.loadLines(part.id);
  }
}
