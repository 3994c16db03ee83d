import { NgTemplateOutlet } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  ElementRef,
  inject,
  signal,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { RouterLink } from '@angular/router';

import {
  JOB_STATE_HINTS,
  JOB_STATE_LABELS,
  OPEN_STATES,
  type JobListItemJson,
} from '../../../shared/api/jobs';
import { waitingForWords } from '../../../shared/part-needs';
import { Session } from '../core/session';
import { JobsApi, type JobListQuery } from './jobs-api';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { BenchMode, BenchModeToggle } from '../ui/bench-mode';
import { ListState } from '../ui/list-state';
import { debounced, loadEach } from '../ui/load';
import { SearchField, type Searched } from '../ui/list-fields';

/** Enough for every open job a shop has on the go; more than this shows a note to search. */
const BOARD_SIZE = 300;

/**
 * The job bench: every open job in a column for its stage, due date first, with the jobs that wait
 * for parts marked. Closed jobs are one switch away.
 */
@Component({
  selector: 'app-job-board',
  imports: [
    SearchField,
    BenchModeToggle,
    ShopDatePipe,
    ListState,
    MatButtonModule,
    MatButtonToggleModule,
    MatIconModule,
    MatSlideToggleModule,
    NgTemplateOutlet,
    RouterLink,
  ],
  templateUrl: './job-board.html',
  styleUrl: './job-board.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class JobBoard {
  private readonly api = inject(JobsApi);
  private readonly session = inject(Session);
  protected readonly bench = inject(BenchMode);

  protected readonly labels = JOB_STATE_LABELS;
  protected readonly hints = JOB_STATE_HINTS;
  protected readonly canTakeIn = computed(() => this.session.may('runCounter'));

  protected readonly text = signal('');
  /** The board has no paged list: the search box drives its own text, sent with the board's query. */
  protected readonly search: Searched = {
    text: this.text,
    onSearch: (value) => this.text.set(value),
  };
  protected readonly show = signal<'open' | 'closed'>('open');
  protected readonly waitingOnly = signal(false);
  private readonly q = debounced(this.text);

  private readonly query = computed(
    () =>
      ({
        state: this.show(),
        q: this.q() || undefined,
        waiting: this.show() === 'open' && this.waitingOnly() ? true : undefined,
        sort: this.show() === 'open' ? 'due' : 'created',
        dir: this.show() === 'open' ? 'asc' : 'desc',
        page: 1,
        pageSize: BOARD_SIZE,
      }) satisfies JobListQuery,
  );

  protected readonly loaded = loadEach(this.query, (query) => this.api.list(query));
  protected readonly jobs = computed(() => this.loaded.value()?.items ?? []);
  protected readonly total = computed(() => this.loaded.value()?.total ?? 0);

  /** One column per open stage, each keeping the server's order (due date first). */
  protected readonly columns = computed(() =>
    OPEN_STATES.map((state) => ({
      state,
      jobs: this.jobs().filter((job) => job.state === state),
    })),
  );
  /** "a piston", "a ring set" or both: which part a waiting job lacks. */
  protected readonly waitingWords = waitingForWords;
  protected readonly waitingCount = computed(
    () => this.jobs().filter((job) => job.waitingForParts).length,
  );

  protected readonly summary = computed(() => {
    const total = this.total();
    const s = total === 1 ? '' : 's';
    const head =
      this.show() === 'open'
        ? `${total} open job${s}${this.waitingCount() > 0 ? `, ${this.waitingCount()} waiting for parts` : ''}.`
        : `${total} closed job${s}, newest first.`;
    const shown = this.jobs().length;
    return total > shown ? `${head} Showing the first ${shown}: search to narrow it.` : head;
  });

  private readonly strip = viewChild<ElementRef<HTMLElement>>('strip');

  /** Brings a stage's column into view in the strip (on a tablet most sit off to the side). */
  protected goToStage(state: string): void {
    const strip = this.strip()?.nativeElement;
    const column = strip?.querySelector<HTMLElement>(`#column-${state}`);
    if (!strip || !column) return;
    // The strip is positioned, so a column's offsetLeft is measured from the strip's own start.
    strip.scrollTo({ left: column.offsetLeft, behavior: 'smooth' });
    column.querySelector<HTMLElement>('a.job-card')?.focus({ preventScroll: true });
  }

  protected stateLabel(job: JobListItemJson): string {
    return JOB_STATE_LABELS[job.state];
  }
}
