import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  linkedSignal,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';

import type { LadderStepJson, LadderUnitJson } from '../../../shared/api/catalog';
import type { LengthUnit } from '../../../shared/lengths';
import { emptyStepWords, type NeededPart } from '../../../shared/part-needs';
import { apiErrorMessage } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Session } from '../core/session';
import { CatalogApi } from './catalog-api';
import { loadById } from '../ui/load';
import { ListState } from '../ui/list-state';

/** Pistons per page when a step is opened in full. */
const SHELF_PAGE = 100;

/**
 * One engine family, every step as a row: what is on the shelf, what is held for jobs, what is
 * free (each free piston with its measured size) and what is on order. A step with no free piston
 * stands out by an icon, a word and a heavy edge, so it reads without colour.
 */
@Component({
  selector: 'app-step-ladder',
  imports: [
    ListState,
    LengthPipe,
    MatButtonModule,
    MatButtonToggleModule,
    MatIconModule,
    MatTooltipModule,
    RouterLink,
  ],
  templateUrl: './step-ladder.html',
  styleUrl: './step-ladder.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StepLadder {
  private readonly api = inject(CatalogApi);
  private readonly session = inject(Session);

  /** The family id, from the route. */
  readonly id = input.required<string>();

  protected readonly loaded = loadById(this.id, (id) => this.api.ladder(id));
  protected readonly ladder = this.loaded.value;
  protected readonly emptySteps = computed(
    () => this.ladder()?.steps.filter((step) => step.nothingFree).length ?? 0,
  );
  protected readonly missingWords = emptyStepWords;

  /** How many steps lack this part (a step may lack both). */
  protected shortOf(part: NeededPart): number {
    return this.ladder()?.steps.filter((step) => step.missing.includes(part)).length ?? 0;
  }

  protected capitalized(text: string): string {
    return text.charAt(0).toUpperCase() + text.slice(1);
  }

  /** Starts in the person's own unit; the toggle switches this page only. */
  protected readonly unit = linkedSignal<LengthUnit>(() => this.session.unit());
  protected readonly canReceive = computed(() => this.session.may('receiveStock'));

  /** Steps opened in full: every piston on the shelf, loaded a page at a time. */
  private readonly opened = signal<Record<string, { units: LadderUnitJson[]; total: number }>>({});
  protected readonly openError = signal('');

  protected shelf(step: LadderStepJson): LadderUnitJson[] {
    return this.opened()[step.stepId]?.units ?? step.units;
  }

  protected freeUnits(step: LadderStepJson): LadderUnitJson[] {
    return this.shelf(step).filter((unit) => unit.status === 'free');
  }

  protected heldUnits(step: LadderStepJson): LadderUnitJson[] {
    return this.shelf(step).filter((unit) => unit.status === 'held');
  }

  /** How many of the step's pistons are not shown yet. */
  protected notShown(step: LadderStepJson): number {
    const open = this.opened()[step.stepId];
    return open ? open.total - open.units.length : step.unitsTotal - step.units.length;
  }

  /** The first click swaps the few nearest the nominal for the full shelf; each next one adds a page. */
  protected showMore(step: LadderStepJson): void {
    const open = this.opened()[step.stepId];
    const page = open ? Math.floor(open.units.length / SHELF_PAGE) + 1 : 1;
    this.openError.set('');
    this.api.stepUnits(this.id(), step.stepId, page, SHELF_PAGE).subscribe({
      next: (res) =>
        this.opened.update((all) => ({
          ...all,
          [step.stepId]: { units: [...(open?.units ?? []), ...res.items], total: res.total },
        })),
      error: (error: unknown) => this.openError.set(apiErrorMessage(error)),
    });
  }

  protected setUnit(value: unknown): void {
    if (value === 'mm' || value === 'in') this.unit.set(value);
  }

  /** Asking again also folds the opened steps back: their pages belong to the old answer. */
  protected reload(): void {
    this.opened.set({});
    this.loaded.reload();
  }
}
