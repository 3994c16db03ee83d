import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  model,
  signal,
} from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';

import { cylinderInput, type CustomerCylinderJson } from '../../../shared/api/customers';
import { formatShopDate } from '../../../shared/dates';
import { apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { Session } from '../core/session';
import { CustomersApi } from '../customers/customers-api';
import { loadEach } from '../ui/load';

/**
 * At intake: which of the customer's known cylinders each job cylinder is, or a new one under the
 * shop's mark. Linking is what lets the bench see the cylinder's earlier bores.
 */
@Component({
  selector: 'app-intake-cylinders',
  imports: [
    FormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
  ],
  templateUrl: './intake-cylinders.html',
  styleUrl: './intake-cylinders.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class IntakeCylinders {
  private readonly api = inject(CustomersApi);
  private readonly session = inject(Session);

  readonly customerId = input.required<string>();
  readonly familyId = input.required<string>();
  readonly count = input.required<number>();
  /** One entry per job cylinder: the customer's cylinder id, or null for none. */
  readonly linked = model<(string | null)[]>([]);

  protected readonly known = loadEach(this.customerId, (id) => this.api.cylinders(id));
  /** Only cylinders of this engine family can be this job's. */
  protected readonly ofFamily = computed(() =>
    (this.known.value() ?? []).filter((c) => c.familyId === this.familyId()),
  );
  protected readonly otherFamilies = computed(
    () => (this.known.value() ?? []).filter((c) => c.familyId !== this.familyId()).length,
  );
  protected readonly slots = computed(() =>
    Array.from({ length: this.count() }, (_, i) => ({ n: i + 1, id: this.linked()[i] ?? null })),
  );

  protected readonly mark = signal('');
  protected readonly castNumber = signal('');
  protected readonly adding = signal(false);
  protected readonly addErrors = signal<{ mark?: string; castNumber?: string; form?: string }>({});

  constructor() {
    // Keep one entry per job cylinder, and drop links that no longer fit (another family). A
    // cylinder just added may not be in the list yet: only a known mismatch drops a link.
    effect(() => {
      const family = this.familyId();
      const wrong = new Set(
        (this.known.value() ?? []).filter((c) => c.familyId !== family).map((c) => c.id),
      );
      const current = this.linked();
      const next = Array.from({ length: this.count() }, (_, i) => {
        const id = current[i] ?? null;
        return id && !wrong.has(id) ? id : null;
      });
      if (next.length !== current.length || next.some((id, i) => id !== current[i])) {
        this.linked.set(next);
      }
    });
  }

  protected summary(c: CustomerCylinderJson): string {
    const bores = c.bores.length;
    const last = c.bores.at(-1);
    const boreText =
      bores === 0
        ? 'never bored here'
        : `bored ${bores}× (last ${last?.stepLabel ?? 'unknown step'}, ${this.day(last?.date)})`;
    const left =
      c.stepsLeft === 0
        ? 'no steps left'
        : `${c.stepsLeft} step${c.stepsLeft === 1 ? '' : 's'} left`;
    return `${boreText} · ${left}`;
  }

  /** A YYYY-MM-DD date the shop's one way. */
  private day(date: string | undefined): string {
    return formatShopDate(date, 'date', {
      locale: this.session.locale(),
      timeZone: this.session.timeZone(),
    });
  }

  protected byId(id: string | null): CustomerCylinderJson | null {
    return this.ofFamily().find((c) => c.id === id) ?? null;
  }

  /** A cylinder already on another job cylinder is not offered twice. */
  protected takenElsewhere(id: string, n: number): boolean {
    return this.linked().some((other, i) => other === id && i !== n - 1);
  }

  protected setSlot(n: number, id: string | null): void {
    const next = [...this.linked()];
    next[n - 1] = id;
    this.linked.set(next);
  }

  protected add(): void {
    if (this.adding()) return;
    const body = {
      mark: this.mark(),
      familyId: this.familyId(),
      castNumber: this.castNumber(),
    };
    const checked = cylinderInput.safeParse(body);
    if (!checked.success) {
      const errors: { mark?: string; castNumber?: string } = {};
      for (const issue of checked.error.issues) {
        const field = String(issue.path[0] ?? '');
        if ((field === 'mark' || field === 'castNumber') && !errors[field]) {
          errors[field] = issue.message;
        }
      }
      this.addErrors.set(errors);
      return;
    }
    this.addErrors.set({});
    this.adding.set(true);
    this.api
      .addCylinder(this.customerId(), {
        mark: checked.data.mark,
        familyId: checked.data.familyId,
        castNumber: checked.data.castNumber ?? null,
      })
      .subscribe({
        next: (created) => {
          this.adding.set(false);
          this.mark.set('');
          this.castNumber.set('');
          // The new cylinder goes on the first job cylinder not linked yet.
          const free = this.linked().findIndex((id) => id === null);
          if (free >= 0) this.setSlot(free + 1, created.id);
          this.known.reload();
        },
        error: (error: unknown) => {
          this.adding.set(false);
          const fields = apiFieldErrors(error);
          this.addErrors.set({
            mark: fields['mark'],
            castNumber: fields['castNumber'],
            form: fields['mark'] || fields['castNumber'] ? undefined : apiErrorMessage(error),
          });
        },
      });
  }
}
