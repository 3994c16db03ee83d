import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatDatepickerModule } from '@angular/material/datepicker';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import type { DateTime } from 'luxon';
import { catchError, map, of } from 'rxjs';

import type { FamilyJson } from '../../../shared/api/catalog';
import type { CustomerListItemJson } from '../../../shared/api/customers';
import { dueDateWarning, patternHint } from '../../../shared/dates';
import { jobInput } from '../../../shared/api/jobs';
import { apiErrorBody, apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Notifier } from '../core/notifier';
import { CustomersApi } from '../customers/customers-api';
import { CustomerSearch } from '../customers/customer-search';
import { IntakeCustomerForm } from './intake-customer-form';
import { IntakeCylinders } from './intake-cylinders';
import { Session } from '../core/session';
import { dayOf } from '../core/shop-date-adapter';
import { JobsApi, type NewJob } from './jobs-api';
import { FormAlert } from '../ui/form-alert';

const FIELDS = ['customerId', 'familyId', 'cylinders', 'askedFor', 'dueDate', 'notes'] as const;
type Field = (typeof FIELDS)[number];

function isField(name: string): name is Field {
  return (FIELDS as readonly string[]).includes(name);
}

/** What most customers ask for, one tap each; the field stays free to type in. */
const QUICK_ASKS = [
  'Bore and hone to the next size that cleans up',
  'Hone and new rings only',
  'Measure and quote before any work',
];

type Families = { ok: true; items: FamilyJson[] } | { ok: false; message: string };

/**
 * Taking a cylinder job in at the counter: who (found as you type, or added on the spot), which
 * engine, how many cylinders and which of the customer's cylinders they are, by when.
 */
@Component({
  selector: 'app-job-intake',
  imports: [
    FormAlert,
    CustomerSearch,
    IntakeCustomerForm,
    IntakeCylinders,
    LengthPipe,
    MatButtonModule,
    MatButtonToggleModule,
    MatCheckboxModule,
    MatDatepickerModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './job-intake.html',
  styleUrl: './job-intake.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobIntake {
  private readonly api = inject(JobsApi);
  private readonly customers = inject(CustomersApi);
  private readonly router = inject(Router);
  private readonly notifier = inject(Notifier);
  private readonly fb = inject(NonNullableFormBuilder);
  private readonly session = inject(Session);

  /** ?forCustomer=<id>: the job is for this customer (from the customer's page). */
  readonly forCustomer = input<string>();

  protected readonly quickAsks = QUICK_ASKS;
  protected readonly form = this.fb.group({
    familyId: ['', Validators.required],
    cylinders: [1, [Validators.required, Validators.min(1)]],
    askedFor: ['', Validators.maxLength(300)],
    dueDate: this.fb.control<DateTime | null>(null),
    notes: ['', Validators.maxLength(2000)],
    notifyCustomer: [true],
  });

  private readonly loadedFamilies = toSignal(
    this.api.families().pipe(
      map((items): Families => ({ ok: true, items })),
      catchError((error: unknown) => of<Families>({ ok: false, message: apiErrorMessage(error) })),
    ),
  );
  protected readonly families = computed(() => {
    const loaded = this.loadedFamilies();
    return loaded?.ok ? loaded.items : [];
  });
  protected readonly familiesError = computed(() => {
    const loaded = this.loadedFamilies();
    return loaded && !loaded.ok ? loaded.message : '';
  });

  /** How a date is typed here: the shop's one pattern. */
  protected readonly datePattern = computed(() => patternHint(this.session.locale()));
  private readonly dueDate = toSignal(this.form.controls.dueDate.valueChanges, {
    initialValue: null,
  });
  /** A caution, not a refusal: a due date long past or far ahead is usually a typing slip. */
  protected readonly dueWarning = computed(() => {
    const day = dayOf(this.dueDate());
    return day ? dueDateWarning(day, this.session.timeZone()) : null;
  });

  protected readonly familyId = toSignal(this.form.controls.familyId.valueChanges, {
    initialValue: '',
  });
  protected readonly cylinderCount = toSignal(this.form.controls.cylinders.valueChanges, {
    initialValue: 1,
  });

  /** The customer the job is for: picked from the search or just added. */
  protected readonly customer = signal<CustomerListItemJson | null>(null);
  protected readonly addingCustomer = signal(false);
  /** The customer's cylinder for each job cylinder (null: not marked). */
  protected readonly cylinderIds = signal<(string | null)[]>([]);
  protected readonly family = computed(
    () => this.families().find((f) => f.id === this.familyId()) ?? null,
  );
  /** One button per cylinder count the engine allows. */
  protected readonly cylinderChoices = computed(() => {
    const family = this.family();
    return family ? Array.from({ length: family.cylinders }, (_, i) => i + 1) : [1];
  });

  protected readonly busy = signal(false);
  protected readonly problem = signal('');
  protected readonly serverErrors = signal<Partial<Record<Field, string>>>({});

  constructor() {
    effect(() => {
      const id = this.forCustomer();
      if (!id) return;
      untracked(() =>
        this.customers.get(id).subscribe({
          next: (c) => this.pickCustomer(c),
          error: (error: unknown) =>
            this.problem.set(`That customer could not be loaded. ${apiErrorMessage(error)}`),
        }),
      );
    });
  }

  protected chooseFamily(id: string): void {
    const family = this.families().find((f) => f.id === id);
    // A whole engine usually comes in: preselect all its cylinders.
    if (family) this.form.controls.cylinders.setValue(family.cylinders);
  }

  protected pickCustomer(customer: CustomerListItemJson): void {
    this.customer.set(customer);
    this.addingCustomer.set(false);
    this.cylinderIds.set([]);
    this.problem.set('');
    // A returning engine: when every cylinder on record is of one family, that is the family.
    if (this.form.controls.familyId.value) return;
    this.customers.cylinders(customer.id).subscribe({
      next: (cylinders) => {
        const families = new Set(cylinders.map((c) => c.familyId));
        const [only] = [...families];
        if (families.size === 1 && !this.form.controls.familyId.value && this.familyKnown(only)) {
          this.form.controls.familyId.setValue(only);
          this.chooseFamily(only);
        }
      },
      // The cylinders panel shows its own error; the family is then chosen by hand.
      error: () => undefined,
    });
  }

  protected changeCustomer(): void {
    this.customer.set(null);
    this.cylinderIds.set([]);
  }

  private familyKnown(id: string): boolean {
    return this.families().some((f) => f.id === id);
  }

  protected ask(text: string): void {
    this.form.controls.askedFor.setValue(text);
    this.form.controls.askedFor.markAsDirty();
  }

  protected submit(): void {
    if (this.busy()) return;
    this.serverErrors.set({});
    this.problem.set('');
    const customer = this.customer();
    if (!customer) {
      this.problem.set('Find the customer, or add them as a new customer, first.');
    }
    if (this.form.invalid || !customer) {
      this.form.markAllAsTouched();
      return;
    }
    const v = this.form.getRawValue();
    const linked = this.cylinderIds().slice(0, v.cylinders);
    const body: NewJob = {
      customerId: customer.id,
      ...(linked.some((id) => id !== null) ? { cylinderIds: linked } : {}),
      familyId: v.familyId,
      cylinders: v.cylinders,
      askedFor: v.askedFor,
      dueDate: dayOf(v.dueDate),
      notes: v.notes,
      notifyCustomer: v.notifyCustomer,
    };
    // The same schema the server checks with, so the same words show before the round trip.
    const checked = jobInput.safeParse(body);
    if (!checked.success) {
      const errors: Partial<Record<Field, string>> = {};
      for (const issue of checked.error.issues) {
        const field = String(issue.path[0] ?? '');
        if (isField(field) && !errors[field]) {
          errors[field] = issue.message;
          this.markControl(field);
        }
      }
      this.serverErrors.set(errors);
      return;
    }
    this.busy.set(true);
    this.api.create(body).subscribe({
      next: (job) => {
        this.notifier.success(`Job ${job.number} booked in.`);
        void this.router.navigate(['/jobs', job.id]);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        const fields = Object.entries(apiFieldErrors(error));
        const known: Partial<Record<Field, string>> = {};
        for (const [field, message] of fields) {
          if (isField(field)) {
            known[field] = message;
            this.markControl(field);
          }
        }
        this.serverErrors.set(known);
        const allPlaced = fields.length > 0 && fields.every(([field]) => isField(field));
        const summary = apiErrorBody(error)?.error.message;
        this.problem.set(allPlaced && summary ? summary : apiErrorMessage(error));
      },
    });
  }

  /** The customer has no control of its own: its error shows under the customer's pick. */
  private markControl(field: Field): void {
    if (field === 'customerId') return;
    this.form.controls[field].setErrors({ server: true });
    this.form.controls[field].markAsTouched();
  }
}
