import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';

import type { PartJson } from '../../../shared/api/catalog';
import type {
  Figure,
  ReorderRuleJson,
  ReorderSuggestionJson,
} from '../../../shared/api/purchasing';
import { apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { PurchasingApi } from './purchasing-api';
import { FormAlert } from '../ui/form-alert';

const whole = [Validators.min(0), Validators.max(1_000_000), Validators.pattern(/^\d+$/)];

/**
 * One part's reorder rule: set by hand, or from a suggestion computed from its issue history, with
 * every figure shown together with how it was reached.
 */
@Component({
  selector: 'app-reorder-rule-page',
  imports: [
    FormAlert,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './reorder-rule-page.html',
  styleUrl: './reorder-rule-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReorderRulePage {
  private readonly api = inject(PurchasingApi);
  private readonly notifier = inject(Notifier);

  readonly partId = input.required<string>();

  protected readonly part = signal<PartJson | null>(null);
  protected readonly rule = signal<ReorderRuleJson | null>(null);
  protected readonly loadError = signal('');
  protected readonly saving = signal(false);
  protected readonly fieldErrors = signal<Record<string, string>>({});
  protected readonly suggestion = signal<ReorderSuggestionJson | null>(null);
  protected readonly suggesting = signal(false);
  protected readonly suggestError = signal('');

  protected readonly form = new FormGroup({
    reorderPoint: new FormControl<number | null>(null, whole),
    orderUpTo: new FormControl<number | null>(null, whole),
  });
  protected readonly inputs = new FormGroup({
    windowDays: new FormControl<number>(180, {
      nonNullable: true,
      validators: [Validators.required, Validators.min(14), Validators.max(730)],
    }),
    leadDays: new FormControl<number | null>(null, [Validators.min(0), Validators.max(365)]),
    servicePercent: new FormControl<number | null>(null, [
      Validators.min(50),
      Validators.max(99.9),
    ]),
  });

  constructor() {
    effect(() => this.load(this.partId()));
  }

  private load(partId: string): void {
    this.loadError.set('');
    this.api.part(partId).subscribe({
      next: (part) => this.part.set(part),
      error: (error: unknown) => this.loadError.set(apiErrorMessage(error)),
    });
    this.api.rule(partId).subscribe({
      next: (rule) => {
        this.rule.set(rule);
        this.form.setValue({ reorderPoint: rule.reorderPoint, orderUpTo: rule.orderUpTo });
      },
      error: (error: unknown) => this.loadError.set(apiErrorMessage(error)),
    });
  }

  protected suggest(): void {
    if (this.inputs.invalid) {
      this.inputs.markAllAsTouched();
      return;
    }
    const v = this.inputs.getRawValue();
    this.suggesting.set(true);
    this.suggestError.set('');
    this.api
      .suggestion(this.partId(), {
        windowDays: v.windowDays,
        leadDays: v.leadDays ?? undefined,
        serviceLevel: v.servicePercent === null ? undefined : v.servicePercent / 100,
      })
      .subscribe({
        next: (s) => {
          this.suggesting.set(false);
          this.suggestion.set(s);
        },
        error: (error: unknown) => {
          this.suggesting.set(false);
          this.suggestError.set(apiErrorMessage(error));
        },
      });
  }

  protected useSuggestion(s: ReorderSuggestionJson): void {
    this.form.setValue({ reorderPoint: s.reorderPoint.value, orderUpTo: s.orderUpTo.value });
    this.form.markAsDirty();
  }

  protected figures(s: ReorderSuggestionJson): { label: string; figure: Figure }[] {
    const rows: { label: string; figure: Figure | null }[] = [
      { label: 'Issued in the window', figure: s.issued },
      { label: 'Asked for, none free (lost sales)', figure: s.lostDemand },
      { label: 'Average a day', figure: s.meanDaily },
      { label: 'Day-to-day spread (σ)', figure: s.sigmaDaily },
      { label: 'A year at that rate', figure: s.annualDemand },
      { label: 'Lead time, days', figure: s.leadDays },
      { label: 'Lead-time spread (σ), days', figure: s.sigmaLeadDays },
      { label: 'Service level', figure: s.serviceLevel },
      { label: 'z', figure: s.z },
      { label: 'Used during the lead time', figure: s.demandOverLead },
      { label: 'Safety stock', figure: s.safetyStock },
      { label: 'Reorder point', figure: s.reorderPoint },
      { label: 'Order quantity (EOQ)', figure: s.orderQuantity },
      { label: 'Order up to', figure: s.orderUpTo },
    ];
    return rows.filter((r): r is { label: string; figure: Figure } => r.figure !== null);
  }

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const v = this.form.getRawValue();
    const toNumber = (x: number | null) => (x === null || (x as unknown) === '' ? null : Number(x));
    this.saving.set(true);
    this.fieldErrors.set({});
    this.api
      .setRule(this.partId(), {
        reorderPoint: toNumber(v.reorderPoint),
        orderUpTo: toNumber(v.orderUpTo),
      })
      .subscribe({
        next: (rule) => {
          this.saving.set(false);
          this.rule.set(rule);
          this.form.markAsPristine();
          void this.notifier.success('Reorder rule saved.');
        },
        error: (error: unknown) => {
          this.saving.set(false);
          this.fieldErrors.set(apiFieldErrors(error));
          void this.notifier.error(apiErrorMessage(error));
        },
      });
  }
}
