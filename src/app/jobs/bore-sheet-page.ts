import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import { filter } from 'rxjs';

import {
  isOpenState,
  JOB_STATE_LABELS,
  type BoreSheetJson,
  type JobState,
} from '../../../shared/api/jobs';
import { formatIn, formatMm, parseLength, type LengthUnit, type Nm } from '../../../shared/lengths';
import { apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Notifier } from '../core/notifier';
import { OfflineStatus } from '../core/offline-status';
import { Session } from '../core/session';
import { CutDialog, type CutDialogData, type CutDialogResult } from './cut-dialog';
import { BenchQueue, serverUnreachable, type FinishChanges } from './bench-queue';
import { JobsApi, type CylinderChanges } from './jobs-api';
import { PassTicks } from './pass-ticks';
import { WaitingEntries } from './waiting-entries';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { BenchMode, BenchModeToggle } from '../ui/bench-mode';
import { ListState } from '../ui/list-state';
import { loadEach } from '../ui/load';
import { allows } from '../../../shared/access';
import { FormAlert } from '../ui/form-alert';

/**
 * The sheet that goes to the boring machine: every size worked out from the held piston, the
 * passes, the hone stock and the ring gap to check, with the cautions. Prints on one page.
 */
@Component({
  selector: 'app-bore-sheet-page',
  imports: [
    BenchModeToggle,
    FormAlert,
    ShopDatePipe,
    LengthPipe,
    ListState,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatTooltipModule,
    RouterLink,
    WaitingEntries,
  ],
  templateUrl: './bore-sheet-page.html',
  styleUrl: './bore-sheet-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BoreSheetPage {
  private readonly api = inject(JobsApi);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);
  private readonly dialog = inject(MatDialog);
  private readonly queue = inject(BenchQueue);
  /** Offline, sizes after honing wait on the tablet; the cut needs the server. */
  protected readonly online = inject(OfflineStatus).online;
  /** On a tablet at the machine: a finger's targets and type read at arm's length. */
  protected readonly bench = inject(BenchMode);

  readonly id = input.required<string>();
  readonly n = input.required<string>();
  protected readonly cylinderNo = computed(() => Number(this.n()));
  protected readonly unit = this.session.unit;
  protected readonly other = computed((): LengthUnit => (this.unit() === 'mm' ? 'in' : 'mm'));
  protected readonly printedAt = new Date();

  protected readonly loaded = loadEach(
    computed(() => ({ id: this.id(), n: this.cylinderNo() })),
    ({ id, n }) => this.api.boreSheet(id, n),
  );
  protected readonly sheet = this.loaded.value;
  protected readonly open = computed(() => {
    const sheet = this.sheet();
    return sheet ? isOpenState(sheet.job.state) : false;
  });

  protected readonly ticks = inject(PassTicks);

  /** Passes done: the server's count, or the last tick still waiting on this tablet. */
  protected readonly ticked = computed(() => {
    const sheet = this.sheet();
    return sheet ? this.ticks.done(sheet) : 0;
  });

  protected tickPass(index: number): void {
    const sheet = this.sheet();
    if (sheet && !this.busy()) this.ticks.tick(sheet, index, () => this.loaded.reload());
  }

  protected readonly passKinds: Record<string, string> = {
    truing: 'Truing',
    roughing: 'Cut',
    finish: 'Finish',
  };

  protected readonly busy = signal(false);
  protected readonly clearanceText = signal('');
  protected readonly honedText = signal('');
  protected readonly gapText = signal('');
  protected readonly overrideText = signal('');
  /** The job's state when the sizes after honing were sent: the page says when the job moved on. */
  private readonly stateWhenRecorded = signal<JobState | null>(null);
  protected readonly movedOnTo = computed(() => {
    const before = this.stateWhenRecorded();
    const now = this.sheet()?.job.state;
    return before && now && now !== before ? JOB_STATE_LABELS[now] : null;
  });

  protected print(): void {
    window.print();
  }

  protected setClearance(text: string | null): void {
    let clearance: string | null = null;
    if (text !== null) {
      const parsed = parseLength(text, { defaultUnit: this.unit(), allowZero: true });
      if (!parsed.ok) {
        this.clearanceError.set(parsed.message);
        return;
      }
      clearance = exact(parsed.nm, parsed.unit);
    }
    this.clearanceError.set('');
    this.save(
      { clearance },
      clearance === null ? "Clearance from the shop's policy." : 'Clearance set.',
      () => this.clearanceText.set(''),
      (error) =>
        this.clearanceError.set(apiFieldErrors(error)['clearance'] ?? apiErrorMessage(error)),
    );
  }

  /**
   * Who may take the cut back from this page: the machinist who marked it, in the first minutes
   * (until undoUntil), and the owner at any time with a reason. The server decides again.
   */
  protected readonly undo = computed((): { reasonNeeded: boolean } | null => {
    const sheet = this.sheet();
    const user = this.session.user();
    if (!sheet?.cutAt || !user || sheet.measuredAfterHone || sheet.ringGapMeasured) return null;
    const ownWindow =
      sheet.cutBy?.id === user.id && !!sheet.undoUntil && Date.now() <= Date.parse(sheet.undoUntil);
    if (ownWindow) return { reasonNeeded: false };
    return allows(user.role, 'undoAnyCut') ? { reasonNeeded: true } : null;
  });

  private ask(data: CutDialogData) {
    return this.dialog
      .open<CutDialog, CutDialogData, CutDialogResult>(CutDialog, { data, autoFocus: 'dialog' })
      .afterClosed()
      .pipe(filter((answer): answer is { reason: string } => !!answer));
  }

  protected undoCut(): void {
    const sheet = this.sheet();
    const undo = this.undo();
    if (!sheet || !undo || this.busy()) return;
    this.ask({
      mode: 'undo',
      cylinder: sheet.cylinder,
      pistonLabel: sheet.piston.label,
      reasonNeeded: undo.reasonNeeded,
    }).subscribe(({ reason }) => {
      this.busy.set(true);
      this.api.undoCut(sheet.job.id, sheet.cylinder, reason || undefined).subscribe({
        next: () => {
          this.busy.set(false);
          this.notifier.success(`The cut of cylinder ${sheet.cylinder} is taken back.`);
          this.loaded.reload();
        },
        error: (error: unknown) => {
          this.busy.set(false);
          this.cutProblem.set(apiErrorMessage(error, { reason: 'The reason' }));
        },
      });
    });
  }

  protected readonly cutProblem = signal('');

  protected markCut(): void {
    const sheet = this.sheet();
    if (!sheet || this.busy()) return;
    const reason = this.overrideText().trim();
    if (!sheet.cleanup.cleansUp && reason.length < 3) {
      this.cutProblem.set('Say why the cylinder is cut although the bore does not clean up.');
      return;
    }
    this.cutProblem.set('');
    this.ask({
      mode: 'cut',
      cylinder: sheet.cylinder,
      pistonLabel: sheet.piston.label,
      reasonNeeded: false,
    }).subscribe(() => this.sendCut(sheet, reason));
  }

  private sendCut(sheet: BoreSheetJson, reason: string): void {
    this.busy.set(true);
    this.api
      .markCut(sheet.job.id, sheet.cylinder, sheet.cleanup.cleansUp ? undefined : reason)
      .subscribe({
        next: () => {
          this.busy.set(false);
          this.overrideText.set('');
          this.notifier.success(`Cylinder ${sheet.cylinder} marked as cut.`);
          this.loaded.reload();
        },
        error: (error: unknown) => {
          this.busy.set(false);
          this.cutProblem.set(apiErrorMessage(error, { overrideReason: 'The reason' }));
        },
      });
  }

  protected saveAfterHone(): void {
    const changes: CylinderChanges = {};
    for (const [key, text] of [
      ['measuredAfterHone', this.honedText()],
      ['ringGap', this.gapText()],
    ] as const) {
      if (!text.trim()) continue;
      const parsed = parseLength(text, { defaultUnit: this.unit() });
      if (!parsed.ok) {
        this.afterHoneErrors.set({ [key]: parsed.message });
        return;
      }
      changes[key] = exact(parsed.nm, parsed.unit);
    }
    this.afterHoneErrors.set({});
    if (Object.keys(changes).length === 0) return;
    const typed = changes as FinishChanges;
    if (!this.online()) {
      this.keepForLater(typed);
      return;
    }
    this.stateWhenRecorded.set(this.sheet()?.job.state ?? null);
    this.save(
      changes,
      'Sizes after honing recorded.',
      () => this.clearAfterHone(),
      (error) => {
        if (serverUnreachable(error)) {
          this.keepForLater(typed);
          return;
        }
        const fields = apiFieldErrors(error);
        const placed = fields['measuredAfterHone'] || fields['ringGap'];
        this.afterHoneErrors.set(placed ? fields : { measuredAfterHone: apiErrorMessage(error) });
      },
    );
  }

  private clearAfterHone(): void {
    this.honedText.set('');
    this.gapText.set('');
  }

  /** The server cannot be reached: the sizes wait on this tablet, based on what the sheet showed. */
  private keepForLater(changes: FinishChanges): void {
    const sheet = this.sheet();
    if (!sheet) return;
    const basedOn = {
      ...(changes.measuredAfterHone !== undefined && {
        measuredAfterHone: sheet.measuredAfterHone,
      }),
      ...(changes.ringGap !== undefined && { ringGap: sheet.ringGapMeasured }),
    };
    void this.queue
      .addFinish({
        jobId: sheet.job.id,
        jobNumber: sheet.job.number,
        cylinder: sheet.cylinder,
        changes,
        basedOn,
      })
      .then(
        () => {
          this.clearAfterHone();
          this.notifier.success('Sizes after honing kept on this tablet until sent.');
        },
        (error: unknown) => this.afterHoneErrors.set({ measuredAfterHone: apiErrorMessage(error) }),
      );
  }

  /** Each reason under the field it is about, said once, instead of a passing snack bar. */
  protected readonly clearanceError = signal('');
  protected readonly afterHoneErrors = signal<Record<string, string>>({});

  private save(
    changes: CylinderChanges,
    success: string,
    after: () => void,
    failed: (error: unknown) => void,
  ): void {
    const sheet = this.sheet();
    if (!sheet || this.busy()) return;
    this.busy.set(true);
    this.api.updateCylinder(sheet.job.id, sheet.cylinder, changes).subscribe({
      next: () => {
        this.busy.set(false);
        this.notifier.success(success);
        after();
        this.loaded.reload();
      },
      error: (error: unknown) => {
        this.busy.set(false);
        failed(error);
      },
    });
  }
}

/** A length as the API reads it back exactly, in the unit it was typed in. */
function exact(nm: Nm, unit: LengthUnit): string {
  return unit === 'in' ? `${formatIn(nm)} in` : `${formatMm(nm)} mm`;
}
