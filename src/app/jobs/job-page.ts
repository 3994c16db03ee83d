import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { RouterLink } from '@angular/router';
import type { Observable } from 'rxjs';

import {
  isOpenState,
  JOB_STATE_HINTS,
  JOB_STATE_LABELS,
  MAX_PHOTO_BYTES,
  OPEN_STATES,
  PHOTO_TYPES,
  type JobJson,
  type OpenState,
} from '../../../shared/api/jobs';
import { waitingForWords } from '../../../shared/part-needs';
import { apiErrorMessage } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { EstimatePanel } from '../money/estimate-panel';
import { InvoicePanel } from '../money/invoice-panel';
import { PaymentsPanel } from '../money/payments-panel';
import { JobCloseDialog, type JobCloseData } from './job-close-dialog';
import { JobsApi } from './jobs-api';
import { makeThumbnail } from './make-thumbnail';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { ListState } from '../ui/list-state';
import { loadById } from '../ui/load';

/** One job: the customer, each cylinder's state, its photos and history, and what to do next. */
@Component({
  selector: 'app-job-page',
  imports: [
    EstimatePanel,
    InvoicePanel,
    PaymentsPanel,
    ShopDatePipe,
    LengthPipe,
    ListState,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSlideToggleModule,
    RouterLink,
  ],
  templateUrl: './job-page.html',
  styleUrl: './job-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobPage {
  private readonly api = inject(JobsApi);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  /** From the route: /jobs/:id. */
  readonly id = input.required<string>();

  protected readonly labels = JOB_STATE_LABELS;
  protected readonly hints = JOB_STATE_HINTS;
  protected readonly openStates = OPEN_STATES;
  protected readonly waitingWords = waitingForWords;
  protected readonly photoTypes = PHOTO_TYPES.join(',');

  protected readonly machine = computed(() => this.session.may('machine'));
  protected readonly counter = computed(() => this.session.may('runCounter'));

  /** The job on screen; an action's answer replaces it (`loaded.set`) without another request. */
  protected readonly loaded = loadById(this.id, (id) => this.api.get(id));
  protected readonly job = this.loaded.value;
  protected readonly open = computed(() => {
    const job = this.job();
    return job ? isOpenState(job.state) : false;
  });
  protected readonly nextState = computed((): OpenState | null => {
    const job = this.job();
    if (!job || !isOpenState(job.state)) return null;
    const index = OPEN_STATES.indexOf(job.state);
    return OPEN_STATES[index + 1] ?? null;
  });

  protected readonly busy = signal(false);
  protected readonly uploading = signal(false);
  protected readonly noteText = signal('');

  protected moveTo(state: OpenState): void {
    const job = this.job();
    if (!job || this.busy()) return;
    this.run(
      this.api.update(job.id, { state }),
      `${job.number} is now ${JOB_STATE_LABELS[state].toLowerCase()}.`,
    );
  }

  protected setNotify(notifyCustomer: boolean): void {
    const job = this.job();
    if (!job) return;
    this.run(
      this.api.update(job.id, { notifyCustomer }),
      notifyCustomer
        ? 'The customer will be told when it is ready.'
        : 'The customer will not be contacted.',
    );
  }

  protected close(mode: 'collect' | 'cancel'): void {
    const job = this.job();
    if (!job) return;
    this.dialog
      .open<JobCloseDialog, JobCloseData, boolean>(JobCloseDialog, { data: { job, mode } })
      .afterClosed()
      .subscribe((confirmed) => {
        if (!confirmed) return;
        this.run(
          mode === 'collect' ? this.api.collect(job.id) : this.api.cancel(job.id),
          mode === 'collect' ? `${job.number} handed back.` : `${job.number} called off.`,
        );
      });
  }

  protected addNote(): void {
    const job = this.job();
    const text = this.noteText().trim();
    if (!job || !text) return;
    this.run(this.api.addNote(job.id, text), 'Note added.', () => this.noteText.set(''));
  }

  protected async upload(event: Event): Promise<void> {
    const job = this.job();
    const target = event.target as HTMLInputElement;
    const file = target.files?.[0];
    target.value = '';
    if (!job || !file) return;
    if (file.size > MAX_PHOTO_BYTES) {
      this.notifier.error(`${file.name} is larger than 10 MB; take a smaller photo.`);
      return;
    }
    this.uploading.set(true);
    const thumbnail = await makeThumbnail(file);
    this.api.uploadPhoto(job.id, file, thumbnail).subscribe({
      next: () => {
        this.uploading.set(false);
        this.notifier.success('Photo added.');
        this.loaded.reload();
      },
      error: (error: unknown) => {
        this.uploading.set(false);
        this.notifier.error(apiErrorMessage(error));
      },
    });
  }

  private run(request: Observable<JobJson>, success: string, after?: () => void): void {
    this.busy.set(true);
    request.subscribe({
      next: (job) => {
        this.busy.set(false);
        this.loaded.set(job);
        this.notifier.success(success);
        after?.();
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.notifier.error(apiErrorMessage(error));
      },
    });
  }
}
