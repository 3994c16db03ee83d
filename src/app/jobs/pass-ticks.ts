import { inject, Injectable, signal } from '@angular/core';

import type { BoreSheetJson } from '../../../shared/api/jobs';
import { apiErrorMessage } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { OfflineStatus } from '../core/offline-status';
import { BenchQueue, serverUnreachable } from './bench-queue';
import { JobsApi } from './jobs-api';

/**
 * The one way a pass is ticked done, from the bore sheet's Done buttons and the tablet's bench card
 * alike: kept with the cylinder on the server, or, offline (or behind earlier entries still
 * waiting), in the tablet's queue to be sent in order with the count it was based on.
 */
@Injectable({ providedIn: 'root' })
export class PassTicks {
  private readonly api = inject(JobsApi);
  private readonly notifier = inject(Notifier);
  private readonly queue = inject(BenchQueue);
  private readonly online = inject(OfflineStatus).online;

  /** A tick on its way to the server; the buttons wait for it. */
  readonly busy = signal(false);

  /** Passes done: the server's count, or the last tick still waiting on this tablet. */
  done(sheet: BoreSheetJson): number {
    const waiting = this.queue
      .forCylinder(sheet.job.id, sheet.cylinder)
      .filter((e) => e.kind === 'passes' && !e.refusal);
    const last = waiting.at(-1);
    return last?.kind === 'passes' ? last.done : sheet.passesDone;
  }

  /**
   * Ticking a pass marks every pass before it done too; unticking it takes it and the later ones
   * back. `sent` runs once the server has it, so the page reads the sheet again.
   */
  tick(sheet: BoreSheetJson, index: number, sent: () => void): void {
    if (this.busy()) return;
    const basedOn = this.done(sheet);
    const done = index < basedOn ? index : index + 1;
    const keep = () =>
      void this.queue
        .addPasses({
          jobId: sheet.job.id,
          jobNumber: sheet.job.number,
          cylinder: sheet.cylinder,
          done,
          basedOn,
        })
        .catch((error: unknown) => this.notifier.error(apiErrorMessage(error)));
    if (!this.online() || this.queue.forCylinder(sheet.job.id, sheet.cylinder).length > 0) {
      // Offline, or earlier entries still waiting: this one goes after them, in order.
      keep();
      return;
    }
    this.busy.set(true);
    this.api.passesDone(sheet.job.id, sheet.cylinder, done, basedOn).subscribe({
      next: () => {
        this.busy.set(false);
        sent();
      },
      error: (error: unknown) => {
        this.busy.set(false);
        if (serverUnreachable(error)) keep();
        else this.notifier.error(apiErrorMessage(error));
      },
    });
  }
}
