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
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatAutocompleteModule } from '@angular/material/autocomplete';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Router, RouterLink } from '@angular/router';
import { map } from 'rxjs';

import {
  PART_KINDS,
  partInput,
  type PartDetailJson,
  type PartJson,
  type PartKind,
} from '../../../shared/api/catalog';
import { apiFieldErrors } from '../core/api-error';
import { placeApiErrors, schemaValidator } from '../core/field-errors';
import { LengthPipe } from '../core/length-pipe';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { lengthForField, lengthText, lengthValidator, otherUnitHint } from '../ui/length-input';
import { CatalogApi, type PartBody } from './catalog-api';
import { KIND_LABELS } from './part-words';
import { debounced, loadEach, loadIntoForm } from '../ui/load';
import { ListState } from '../ui/list-state';
import { familySteps } from './family-steps';
import { FormAlert } from '../ui/form-alert';

interface Component_ {
  partId: string;
  sku: string;
  description: string;
  quantity: number;
}

/**
 * One part: owner and buyer add and edit it (kind, sizes, barcode, price, reorder rule, a kit's
 * contents); everyone else reads it, with its stock and where to find its movements.
 */
@Component({
  selector: 'app-part-form',
  imports: [
    FormAlert,
    ListState,
    MatTooltipModule,
    LengthPipe,
    MatAutocompleteModule,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './part-form.html',
  styleUrl: './part-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PartForm {
  private readonly api = inject(CatalogApi);
  private readonly notifier = inject(Notifier);
  private readonly router = inject(Router);
  private readonly session = inject(Session);
  private readonly fb = inject(NonNullableFormBuilder);

  /** The part id from the route; absent for a new part. */
  readonly id = input<string>();

  protected readonly kinds = PART_KINDS;
  protected readonly kindLabels = KIND_LABELS;
  protected readonly unit = this.session.unit;
  protected readonly canEdit = computed(() => this.session.may('editCatalog'));
  protected readonly canReceive = computed(() => this.session.may('receiveStock'));

  protected readonly form = this.fb.group({
    kind: this.fb.control<PartKind>('piston', Validators.required),
    sku: ['', [Validators.required, schemaValidator(partInput.shape.sku)]],
    description: ['', [Validators.required, schemaValidator(partInput.shape.description)]],
    familyId: [''],
    stepId: [''],
    material: this.fb.control<'cast' | 'forged' | ''>(''),
    ringCount: this.fb.control<number | null>(null, schemaValidator(partInput.shape.ringCount)),
    pinDiameter: ['', lengthValidator(() => this.unit())],
    gtin: ['', schemaValidator(partInput.shape.gtin)],
    salePrice: ['0.00', [Validators.required, schemaValidator(partInput.shape.salePrice)]],
    reorderPoint: this.fb.control<number | null>(
      null,
      schemaValidator(partInput.shape.reorderPoint),
    ),
    orderUpTo: this.fb.control<number | null>(null, schemaValidator(partInput.shape.orderUpTo)),
    active: [true],
  });
  protected readonly components = signal<Component_[]>([]);
  private componentsChanged = false;

  // Raw value: the kind control is disabled once a part exists, and `value` leaves disabled controls out.
  private readonly formValue = toSignal(
    this.form.valueChanges.pipe(map(() => this.form.getRawValue())),
    { initialValue: this.form.getRawValue() },
  );
  protected readonly kind = computed(() => this.formValue().kind ?? 'piston');

  private readonly choices = familySteps(this.api, () => this.formValue().familyId);
  protected readonly families = this.choices.families;
  protected readonly steps = this.choices.steps;

  /** Part search for a kit's contents. */
  protected readonly componentSearch = signal('');
  private readonly componentQuery = debounced(this.componentSearch, 200);
  private readonly componentsFound = loadEach(
    () => (this.componentQuery().length >= 2 ? this.componentQuery() : null),
    (q) => this.api.parts({ q, page: 1, pageSize: 10 }),
  );
  /** A kit holds counted parts, never another kit or itself. */
  protected readonly componentOptions = computed(() =>
    (this.componentsFound.value()?.items ?? []).filter(
      (p) => p.kind !== 'kit' && p.id !== this.id(),
    ),
  );

  /** No id: a new part, nothing to load. A save answers with the part, which replaces it here. */
  protected readonly loaded = loadIntoForm(
    () => this.id() || null,
    (id) => this.api.part(id),
    (part) => this.fill(part),
  );
  protected readonly part = this.loaded.value;
  protected readonly busy = signal(false);
  protected readonly problem = signal('');
  protected readonly serverErrors = signal<Record<string, string>>({});

  constructor() {
    effect(() => {
      if (!this.canEdit()) this.form.disable();
      if (this.id()) this.form.controls.kind.disable();
    });
  }

  protected pinHint(): string {
    return otherUnitHint(this.form.controls.pinDiameter.value, this.unit());
  }

  protected onFamily(): void {
    this.form.controls.stepId.setValue('');
    this.form.controls.stepId.markAsDirty();
  }

  protected addComponent(part: PartJson): void {
    if (this.components().some((c) => c.partId === part.id)) return;
    this.components.update((list) => [
      ...list,
      { partId: part.id, sku: part.sku, description: part.description, quantity: 1 },
    ]);
    this.componentsChanged = true;
    this.componentSearch.set('');
  }

  protected setQuantity(partId: string, value: string): void {
    const quantity = Math.max(1, Math.min(1000, Math.floor(Number(value) || 1)));
    this.components.update((list) =>
      list.map((c) => (c.partId === partId ? { ...c, quantity } : c)),
    );
    this.componentsChanged = true;
  }

  protected removeComponent(partId: string): void {
    this.components.update((list) => list.filter((c) => c.partId !== partId));
    this.componentsChanged = true;
  }

  protected error(field: string): string {
    const control = this.form.get(field);
    if (!control) return '';
    if (control.hasError('required')) return 'This is needed.';
    if (control.hasError('schema')) return String(control.getError('schema'));
    if (control.hasError('length')) return String(control.getError('length'));
    if (control.hasError('min') || control.hasError('max')) return 'Out of range.';
    return this.serverErrors()[field] ?? '';
  }

  protected submit(): void {
    if (this.busy() || !this.canEdit()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const id = this.id();
    const body = this.body(Boolean(id));
    this.busy.set(true);
    this.problem.set('');
    this.serverErrors.set({});
    const request = id ? this.api.updatePart(id, body) : this.api.createPart(body);
    request.subscribe({
      next: (part) => {
        this.busy.set(false);
        this.notifier.success(id ? `${part.sku} saved.` : `${part.sku} added.`);
        if (id) {
          this.loaded.set(part);
        } else {
          void this.router.navigate(['/catalog/parts', part.id]);
        }
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.serverErrors.set(apiFieldErrors(error));
        // Each reason once, under its own field; only what no field shows stays above the form.
        this.problem.set(placeApiErrors(this.form, error));
      },
    });
  }

  private body(editing: boolean): PartBody {
    const v = this.form.getRawValue();
    const c = this.form.controls;
    const body: PartBody = {};
    const changed = (control: { dirty: boolean }) => !editing || control.dirty;
    const kind = v.kind;
    if (!editing) body.kind = kind;
    if (changed(c.sku)) body.sku = v.sku.trim();
    if (changed(c.description)) body.description = v.description.trim();
    if (changed(c.familyId)) body.familyId = v.familyId || null;
    if (changed(c.stepId)) body.stepId = v.stepId || null;
    if (kind === 'piston') {
      if (changed(c.material)) body.material = v.material || null;
      if (changed(c.ringCount)) body.ringCount = v.ringCount ?? null;
    }
    if (changed(c.pinDiameter)) {
      body.pinDiameter = v.pinDiameter.trim() ? lengthText(v.pinDiameter, this.unit()) : null;
    }
    if (changed(c.gtin)) body.gtin = v.gtin.trim() || null;
    if (changed(c.salePrice)) body.salePrice = v.salePrice.trim();
    if (changed(c.reorderPoint)) body.reorderPoint = v.reorderPoint ?? null;
    if (changed(c.orderUpTo)) body.orderUpTo = v.orderUpTo ?? null;
    if (editing && c.active.dirty) body.active = v.active;
    if (kind === 'kit' && (!editing || this.componentsChanged)) {
      body.components = this.components().map((x) => ({ partId: x.partId, quantity: x.quantity }));
    }
    return body;
  }

  private fill(p: PartDetailJson): void {
    this.form.reset({
      kind: p.kind,
      sku: p.sku,
      description: p.description,
      familyId: p.familyId ?? '',
      stepId: p.stepId ?? '',
      material: p.material ?? '',
      ringCount: p.ringCount,
      pinDiameter: lengthForField(p.pinDiameter, this.unit()),
      gtin: p.gtin ?? '',
      salePrice: p.salePrice,
      reorderPoint: p.reorderPoint,
      orderUpTo: p.orderUpTo,
      active: p.active,
    });
    this.components.set(
      p.components.map((c) => ({
        partId: c.partId,
        sku: c.sku,
        description: c.description,
        quantity: c.quantity,
      })),
    );
    this.componentsChanged = false;
  }
}
