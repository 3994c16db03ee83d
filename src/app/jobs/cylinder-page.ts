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
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';

import { assessBore, type BoreAssessment } from '../../../shared/bore-assessment';
import { ReadingsError, type Axis, type Depth, type Reading } from '../../../shared/bore-wear';
import {
  AXIS_LABELS,
  DEPTH_LABELS,
  isOpenState,
  READING_AXES,
  READING_DEPTHS,
  type HoldJson,
} from '../../../shared/api/jobs';
import {
  formatIn,
  formatLength,
  formatMm,
  lengthJsonToNm,
  mmToNm,
  parseLength,
  type LengthJson,
  type LengthUnit,
} from '../../../shared/lengths';
import { apiErrorMessage, apiFieldErrors, apiUnplacedMessage } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Notifier } from '../core/notifier';
import { OfflineStatus } from '../core/offline-status';
import { Session } from '../core/session';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { BenchCard } from './bench-card';
import { CylinderStepper } from './cylinder-stepper';
import { HoldDialog, type HoldDialogData } from './hold-dialog';
import { CylinderPast } from './cylinder-past';
import { BenchQueue, serverUnreachable } from './bench-queue';
import { JobsApi, type ReadingBody } from './jobs-api';
import { WaitingEntries } from './waiting-entries';
import { BenchMode, BenchModeToggle } from '../ui/bench-mode';
import { ListState } from '../ui/list-state';
import { loadById, loadEach } from '../ui/load';
import { FormAlert } from '../ui/form-alert';

type CellKey = `${Depth}-${Axis}`;
interface Cell {
  key: CellKey;
  depth: Depth;
  axis: Axis;
  label: string;
}

const CELLS: Cell[] = READING_DEPTHS.flatMap((depth) =>
  READING_AXES.map((axis) => ({
    key: `${depth}-${axis}` as CellKey,
    depth,
    axis,
    label: `${DEPTH_LABELS[depth]}, ${AXIS_LABELS[axis].toLowerCase()}`,
  })),
);

/** A bore beyond 500 mm is no cylinder Stepstock is for; the server uses the same limit. */
const MAX_BORE_NM = 500_000_000;

interface Preview {
  errors: Partial<Record<CellKey, string>>;
  readings: Reading[];
  assessment: BoreAssessment | null;
  problem: string;
}

/**
 * One cylinder at the machine: type the six bore readings (a live preview computed by the same
 * shared functions the server uses), take the suggested step, and set the measured piston aside.
 */
@Component({
  selector: 'app-cylinder-page',
  imports: [
    FormAlert,
    BenchCard,
    BenchModeToggle,
    CylinderPast,
    CylinderStepper,
    LengthPipe,
    ListState,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    RouterLink,
    ShopDatePipe,
    WaitingEntries,
  ],
  templateUrl: './cylinder-page.html',
  styleUrl: './cylinder-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CylinderPage {
  private readonly api = inject(JobsApi);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);
  private readonly queue = inject(BenchQueue);
  /** Offline, readings wait on the tablet; holding a piston needs the server. */
  protected readonly online = inject(OfflineStatus).online;
  protected readonly bench = inject(BenchMode);

  /** From the route: /jobs/:id/cylinders/:n. */
  readonly id = input.required<string>();
  readonly n = input.required<string>();
  protected readonly cylinderNo = computed(() => Number(this.n()));

  protected readonly axes = READING_AXES;
  protected readonly axisLabels = AXIS_LABELS;
  protected readonly unit = this.session.unit;

  protected readonly loaded = loadById(this.id, (id) => this.api.get(id));
  protected readonly job = this.loaded.value;
  protected readonly cylinder = computed(
    () => this.job()?.cylinderDetails.find((c) => c.n === this.cylinderNo()) ?? null,
  );
  protected readonly open = computed(() => {
    const job = this.job();
    return job ? isOpenState(job.state) : false;
  });
  protected readonly editable = computed(() => this.open() && !this.cylinder()?.cutAt);

  /** The six fields, filled from the saved readings in the unit each was typed in. */
  protected readonly cells = linkedSignal<Record<CellKey, string>>(() => {
    const values = Object.fromEntries(CELLS.map((c) => [c.key, ''])) as Record<CellKey, string>;
    const unit = this.unit();
    for (const r of this.cylinder()?.readings ?? []) {
      const text = r.unit === 'in' ? r.diameter.in : r.diameter.mm;
      values[`${r.depth}-${r.axis}`] = r.unit === unit ? text : `${text} ${r.unit}`;
    }
    return values;
  });
  /** The grid: one row per depth, one field per axis. */
  protected readonly rows = READING_DEPTHS.map((depth) => ({
    depth,
    label: DEPTH_LABELS[depth],
    cells: CELLS.filter((c) => c.depth === depth),
  }));

  /** Recomputed at every keystroke with the server's own functions. */
  protected readonly preview = computed((): Preview => {
    const job = this.job();
    const unit = this.unit();
    const errors: Partial<Record<CellKey, string>> = {};
    const readings: Reading[] = [];
    for (const cell of CELLS) {
      const text = this.cells()[cell.key].trim();
      if (!text) continue;
      const parsed = parseLength(text, { defaultUnit: unit, max: MAX_BORE_NM });
      if (parsed.ok) readings.push({ depth: cell.depth, axis: cell.axis, nm: parsed.nm });
      else errors[cell.key] = parsed.message;
    }
    if (!job || readings.length === 0 || Object.keys(errors).length > 0) {
      return { errors, readings, assessment: null, problem: '' };
    }
    try {
      const f = job.family;
      const assessment = assessBore(
        readings,
        {
          standardBoreNm: mmToNm(f.standardBore.mm),
          cleanupNm: mmToNm(f.cleanup.mm),
          maxOversizeNm: mmToNm(f.maxOversize.mm),
          maxTaperNm: f.maxTaper ? mmToNm(f.maxTaper.mm) : null,
          maxOutOfRoundNm: f.maxOutOfRound ? mmToNm(f.maxOutOfRound.mm) : null,
        },
        unit,
      );
      return { errors, readings, assessment, problem: '' };
    } catch (e) {
      const problem =
        e instanceof ReadingsError ? e.message : 'These readings cannot be worked out.';
      return { errors, readings, assessment: null, problem };
    }
  });

  protected show(nm: number, unit: LengthUnit = this.unit()): string {
    return formatLength(nm, unit);
  }

  /**
   * A step's finished bore minus the largest worn diameter. Below the step that cleans up it is
   * negative: the step does not even reach the wear, which is a real answer, so it reads "short by".
   */
  protected cleanupText(cleanup: LengthJson): string {
    const unit = this.unit();
    const nm = lengthJsonToNm(cleanup, unit);
    return nm < 0 ? `short by ${formatLength(-nm, unit)}` : formatLength(nm, unit);
  }

  protected isShort(cleanup: LengthJson): boolean {
    return lengthJsonToNm(cleanup, 'mm') < 0;
  }

  /** The step choice; asked for once the bore is read, and again after each change here. */
  private readonly rec = loadEach(
    computed(() => {
      const measured = this.cylinder()?.measuredAt ?? null;
      return measured ? { id: this.id(), n: this.cylinderNo(), measured } : null;
    }),
    ({ id, n }) => this.api.recommendation(id, n),
    // The job reloads after every change; only a new measurement or an asked reload refetches.
    { equal: (a, b) => a?.id === b?.id && a?.n === b?.n && a?.measured === b?.measured },
  );
  protected readonly recommendation = this.rec.value;
  protected readonly recError = this.rec.error;
  protected readonly suggested = computed(() => {
    const rec = this.recommendation();
    return rec?.choice ? (rec.steps.find((s) => s.stepId === rec.choice) ?? null) : null;
  });

  protected readonly busy = signal(false);

  /** The server's reasons, under the reading each is about, until that reading is typed again. */
  protected readonly serverCellErrors = signal<Partial<Record<CellKey, string>>>({});
  protected readonly readingsProblem = signal('');

  protected setCell(key: CellKey, value: string): void {
    this.cells.update((cells) => ({ ...cells, [key]: value }));
    this.serverCellErrors.update(({ [key]: _gone, ...rest }) => rest);
  }

  /** "readings.2.diameter" is about the third reading sent, which is one of the six cells. */
  private placeReadingErrors(error: unknown, sent: CellKey[]): void {
    const errors: Partial<Record<CellKey, string>> = {};
    for (const [field, message] of Object.entries(apiFieldErrors(error))) {
      const index = /^readings\.(\d+)/.exec(field)?.[1];
      const key = index === undefined ? undefined : sent[Number(index)];
      if (key && !errors[key]) errors[key] = message;
    }
    this.serverCellErrors.set(errors);
    const placed = (field: string) => {
      const index = /^readings\.(\d+)/.exec(field)?.[1];
      return index !== undefined && sent[Number(index)] !== undefined;
    };
    const rest = apiUnplacedMessage(error, placed, { readings: 'Readings' });
    this.readingsProblem.set(rest === 'Check the marked fields.' ? '' : rest);
  }

  protected saveReadings(): void {
    const job = this.job();
    const preview = this.preview();
    if (!job || this.busy() || !preview.assessment) return;
    const unit = this.unit();
    const body: ReadingBody[] = [];
    const sent: CellKey[] = [];
    for (const cell of CELLS) {
      const text = this.cells()[cell.key].trim();
      if (!text) continue;
      const parsed = parseLength(text, { defaultUnit: unit, max: MAX_BORE_NM });
      if (!parsed.ok) return;
      // Sent exactly as read, in the unit it was typed in.
      const diameter =
        parsed.unit === 'in' ? `${formatIn(parsed.nm)} in` : `${formatMm(parsed.nm)} mm`;
      body.push({ depth: cell.depth, axis: cell.axis, diameter });
      sent.push(cell.key);
    }
    this.serverCellErrors.set({});
    this.readingsProblem.set('');
    if (!this.online()) {
      this.keepForLater(body);
      return;
    }
    this.busy.set(true);
    this.api.saveReadings(job.id, this.cylinderNo(), body).subscribe({
      next: () => {
        this.busy.set(false);
        this.notifier.success(`Readings for cylinder ${this.cylinderNo()} saved.`);
        this.reloadBoth();
      },
      error: (error: unknown) => {
        this.busy.set(false);
        if (serverUnreachable(error)) {
          this.keepForLater(body);
        } else {
          this.placeReadingErrors(error, sent);
        }
      },
    });
  }

  /** The server cannot be reached: the readings wait on this tablet, based on what it showed. */
  private keepForLater(readings: ReadingBody[]): void {
    const job = this.job();
    if (!job) return;
    const n = this.cylinderNo();
    void this.queue
      .addReadings({
        jobId: job.id,
        jobNumber: job.number,
        cylinder: n,
        readings,
        basedOn: this.cylinder()?.measuredAt ?? null,
      })
      .then(
        () => this.notifier.success(`Readings for cylinder ${n} kept on this tablet until sent.`),
        (error: unknown) => this.readingsProblem.set(apiErrorMessage(error)),
      );
  }

  protected chooseStep(stepId: string, label: string): void {
    const job = this.job();
    if (!job || this.busy()) return;
    this.busy.set(true);
    this.api.updateCylinder(job.id, this.cylinderNo(), { stepId }).subscribe({
      next: () => {
        this.busy.set(false);
        this.notifier.success(`Cylinder ${this.cylinderNo()} goes to ${label}.`);
        this.reloadBoth();
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.notifier.error(apiErrorMessage(error));
      },
    });
  }

  /** A job taken in before its cylinder was marked: link it now, so the history rule applies. */
  protected linkCylinder(cylinderId: string): void {
    const job = this.job();
    if (!job || this.busy()) return;
    this.busy.set(true);
    this.api.updateCylinder(job.id, this.cylinderNo(), { cylinderId }).subscribe({
      next: (c) => {
        this.busy.set(false);
        this.notifier.success(`Cylinder ${this.cylinderNo()} is ${c.cylinder?.mark ?? 'linked'}.`);
        this.reloadBoth();
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.notifier.error(apiErrorMessage(error));
      },
    });
  }

  protected openHold(): void {
    const job = this.job();
    if (!job) return;
    this.dialog
      .open<HoldDialog, HoldDialogData, HoldJson>(HoldDialog, {
        data: { jobId: job.id, jobNumber: job.number, cylinder: this.cylinderNo() },
        autoFocus: 'dialog',
      })
      .afterClosed()
      .subscribe((hold) => {
        if (hold) {
          this.notifier.success(
            `${hold.unitLabel ?? hold.sku} is held for cylinder ${hold.cylinder}.`,
          );
          this.reloadBoth();
        }
      });
  }

  protected release(hold: HoldJson): void {
    if (this.busy()) return;
    this.busy.set(true);
    this.api.release(hold.id).subscribe({
      next: () => {
        this.busy.set(false);
        this.notifier.success(`${hold.unitLabel ?? hold.sku} is back on the shelf.`);
        this.reloadBoth();
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.notifier.error(apiErrorMessage(error));
      },
    });
  }

  /** After a change here both the job and the step choice may read differently. */
  protected reloadBoth(): void {
    this.loaded.reload();
    this.rec.reload();
  }
}
