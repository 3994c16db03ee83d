import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import { catchError, map, of } from 'rxjs';

import type { FamilyJson } from '../../../shared/catalog-api';
import { jobInput } from '../../../shared/jobs-api';
import { apiErrorBody, apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Notifier } from '../core/notifier';
import { JobsApi, type NewJob } from './jobs-api';

const FIELDS = [
  'customerName',
  'customerPhone',
  'customerEmail',
  'familyId',
  'cylinders',
  'askedFor',
  'dueDate',
  'notes',
] as const;
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

/** Taking a cylinder job in at the counter: who, which engine, how many cylinders, by when. */
@Component({
  selector: 'app-job-intake',
  imports: [
    LengthPipe,
    MatButtonModule,
    MatButtonToggleModule,
    MatCheckboxModule,
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
  private readonly router = inject(Router);
  private readonly notifier = inject(Notifier);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly quickAsks = QUICK_ASKS;
  protected readonly form = this.fb.group({
    customerName: ['', [Validators.required, Validators.maxLength(120)]],
    customerPhone: ['', [Validators.maxLength(40)]],
    customerEmail: ['', [Validators.email, Validators.maxLength(254)]],
    familyId: ['', Validators.required],
    cylinders: [1, [Validators.required, Validators.min(1)]],
    askedFor: ['', Validators.maxLength(300)],
    dueDate: [''],
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

  private readonly familyId = toSignal(this.form.controls.familyId.valueChanges, {
    initialValue: '',
  });
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

  protected chooseFamily(id: string): void {
    const family = this.families().find((f) => f.id === id);
    // A whole engine usually comes in: preselect all its cylinders.
    if (family) this.form.controls.cylinders.setValue(family.cylinders);
  }

  protected ask(text: string): void {
    this.form.controls.askedFor.setValue(text);
    this.form.controls.askedFor.markAsDirty();
  }

  protected submit(): void {
    if (this.busy()) return;
    this.serverErrors.set({});
    this.problem.set('');
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const v = this.form.getRawValue();
    const body: NewJob = {
      customerName: v.customerName,
      customerPhone: v.customerPhone.trim() || null,
      customerEmail: v.customerEmail.trim() || null,
      familyId: v.familyId,
      cylinders: v.cylinders,
      askedFor: v.askedFor,
      dueDate: v.dueDate || null,
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
          this.form.controls[field].setErrors({ server: true });
          this.form.controls[field].markAsTouched();
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
            this.form.controls[field].setErrors({ server: true });
            this.form.controls[field].markAsTouched();
          }
        }
        this.serverErrors.set(known);
        const allPlaced = fields.length > 0 && fields.every(([field]) => isField(field));
        const summary = apiErrorBody(error)?.error.message;
        this.problem.set(allPlaced && summary ? summary : apiErrorMessage(error));
      },
    });
  }
}
