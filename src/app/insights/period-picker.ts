import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDatepickerModule } from '@angular/material/datepicker';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { DateTime } from 'luxon';

import { patternHint } from '../../../shared/dates';
import { MAX_PERIOD_DAYS } from '../../../shared/api/insights';
import { Session } from '../core/session';
import type { DayRange } from './insights-api';
import { daysBetween } from '../../../shared/api/common';

interface Preset {
  label: string;
  range: (today: DateTime) => DayRange;
}

const day = (d: DateTime) => d.toISODate() as string;

/** Quick periods an owner asks for most. */
export const PERIOD_PRESETS: Preset[] = [
  {
    label: 'Last 12 months',
    range: (t) => ({ from: day(t.startOf('month').minus({ months: 11 })), to: day(t) }),
  },
  {
    label: 'Last 3 months',
    range: (t) => ({ from: day(t.startOf('month').minus({ months: 2 })), to: day(t) }),
  },
  { label: 'This year', range: (t) => ({ from: day(t.startOf('year')), to: day(t) }) },
  {
    label: 'Last year',
    range: (t) => {
      const last = t.minus({ years: 1 });
      return { from: day(last.startOf('year')), to: day(last.endOf('year')) };
    },
  },
];

/**
 * The period of a page: a date-range picker (typed or chosen on the calendar) and quick choices.
 * Emits only complete, valid ranges; the server checks them again.
 */
@Component({
  selector: 'app-period-picker',
  imports: [
    MatButtonModule,
    MatDatepickerModule,
    MatFormFieldModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  templateUrl: './period-picker.html',
  styleUrl: './period-picker.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PeriodPicker {
  readonly period = input.required<DayRange>();
  readonly periodChange = output<DayRange>();

  private readonly session = inject(Session);
  protected readonly presets = PERIOD_PRESETS;
  /** How a day is typed here: the shop's one pattern, e.g. DD/MM/YYYY. */
  protected readonly hint = computed(() => patternHint(this.session.locale()));
  protected readonly range = new FormGroup({
    start: new FormControl<DateTime | null>(null),
    end: new FormControl<DateTime | null>(null),
  });
  protected readonly problem = signal('');

  constructor() {
    effect(() => {
      const { from, to } = this.period();
      this.range.setValue(
        { start: DateTime.fromISO(from), end: DateTime.fromISO(to) },
        { emitEvent: false },
      );
    });
  }

  /** Called when the picker closes or a typed date is complete. */
  protected apply(): void {
    const { start, end } = this.range.getRawValue();
    if (!start?.isValid || !end?.isValid) return;
    const next = { from: day(start), to: day(end) };
    if (daysBetween(next.from, next.to) > MAX_PERIOD_DAYS) {
      this.problem.set(`A period may cover at most ${MAX_PERIOD_DAYS} days; choose a shorter one.`);
      return;
    }
    this.problem.set('');
    const current = this.period();
    if (next.from !== current.from || next.to !== current.to) this.periodChange.emit(next);
  }

  protected choose(preset: Preset): void {
    this.periodChange.emit(preset.range(DateTime.now().startOf('day')));
  }

  protected isActive(preset: Preset): boolean {
    const r = preset.range(DateTime.now().startOf('day'));
    const p = this.period();
    return r.from === p.from && r.to === p.to;
  }
}
