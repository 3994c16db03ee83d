import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

import type { BoreSheetJson } from '../../../shared/api/jobs';
import { LengthPipe } from '../core/length-pipe';
import { Session } from '../core/session';
import { ListState } from '../ui/list-state';
import { loadEach } from '../ui/load';
import { JobsApi } from './jobs-api';
import { PassTicks } from './pass-ticks';

const PASS_WORDS: Record<string, string> = {
  truing: 'truing pass',
  roughing: 'cut',
  finish: 'finishing pass',
};

/**
 * At the machine, in large type: the size to bore to, the pass the bar is on (the cylinder's passes
 * done, ticked here as on the bore sheet, and kept on the tablet while offline), and the bore
 * sheet's cautions, always in view.
 */
@Component({
  selector: 'app-bench-card',
  imports: [LengthPipe, ListState, MatButtonModule, MatIconModule, RouterLink],
  template: `
    <section class="bench-card" aria-labelledby="bench-card-title">
      <h2 id="bench-card-title" class="visually-hidden">At the machine</h2>
      <app-list-state
        [loading]="loaded.loading()"
        [error]="loaded.error()"
        progressLabel="Loading the bore sheet"
        (retry)="loaded.reload()"
      />
      @if (loaded.value(); as s) {
        <p class="figure-line">
          <span class="caption">Bore to</span>
          <span class="figure" data-figure="bore-to">{{ s.boreTo | length }}</span>
          <span class="other">{{ s.boreTo | length: other() }}</span>
        </p>
        @if (s.passes.length > 0) {
          @let i = current();
          @if (i < s.passes.length) {
            <p class="figure-line pass">
              <span class="caption"
                >Pass {{ i + 1 }} of {{ s.passes.length }} · {{ passWords[s.passes[i].kind] }}</span
              >
              <span class="figure" data-figure="pass">{{ s.passes[i].size | length }}</span>
              <span class="other"
                >cuts {{ s.passes[i].cutUnworn | length }} on the least-worn side</span
              >
            </p>
          } @else {
            <p class="figure-line pass done" role="status">
              <span class="caption">All {{ s.passes.length }} passes done</span>
              <span class="other"
                >Hone to {{ s.finishedBore | length }}, then record it below.</span
              >
            </p>
          }
          <div class="pass-buttons">
            <button
              mat-stroked-button
              type="button"
              [disabled]="i === 0 || ticks.busy()"
              (click)="go(s, i - 1)"
            >
              <mat-icon>undo</mat-icon>
              Previous pass
            </button>
            <button
              mat-flat-button
              type="button"
              [disabled]="i >= s.passes.length || ticks.busy()"
              (click)="go(s, i)"
            >
              <mat-icon>check</mat-icon>
              Pass {{ i + 1 }} done
            </button>
          </div>
        } @else if (s.passesNote) {
          <p class="note">No passes: {{ s.passesNote }}.</p>
        }
        <div class="cautions" role="note" aria-label="Cautions">
          <p class="cautions-title"><mat-icon aria-hidden="true">warning</mat-icon>Cautions</p>
          <ul>
            @for (c of s.cautions; track c) {
              <li>{{ c }}</li>
            }
          </ul>
        </div>
        <a mat-stroked-button [routerLink]="['/jobs', jobId(), 'cylinders', n(), 'sheet']">
          <mat-icon>description</mat-icon>
          The whole bore sheet
        </a>
      }
    </section>
  `,
  styleUrl: './bench-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BenchCard {
  private readonly api = inject(JobsApi);
  private readonly session = inject(Session);

  readonly jobId = input.required<string>();
  readonly n = input.required<number>();

  protected readonly passWords = PASS_WORDS;
  protected readonly other = computed(() => (this.session.unit() === 'mm' ? 'in' : 'mm'));
  protected readonly loaded = loadEach(
    computed(() => ({ id: this.jobId(), n: this.n() })),
    ({ id, n }) => this.api.boreSheet(id, n),
    { equal: (a, b) => a.id === b.id && a.n === b.n },
  );
  protected readonly ticks = inject(PassTicks);

  /** Which pass the bar is on: how many are done. */
  protected readonly current = computed(() => {
    const sheet = this.loaded.value();
    return sheet ? Math.min(this.ticks.done(sheet), sheet.passes.length) : 0;
  });

  /** Pass `index` done (or, for the one before the current, taken back). */
  protected go(sheet: BoreSheetJson, index: number): void {
    this.ticks.tick(sheet, index, () => this.loaded.reload());
  }
}
