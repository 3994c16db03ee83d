import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  linkedSignal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

import { LengthPipe } from '../core/length-pipe';
import { Session } from '../core/session';
import { ListState } from '../ui/list-state';
import { loadEach } from '../ui/load';
import { JobsApi } from './jobs-api';

const PASS_WORDS: Record<string, string> = {
  truing: 'truing pass',
  roughing: 'cut',
  finish: 'finishing pass',
};

function passKey(jobId: string, n: number): string {
  return `stepstock.pass.${jobId}.${n}`;
}

function storedPass(jobId: string, n: number): number {
  try {
    const v = Number(localStorage.getItem(passKey(jobId, n)));
    return Number.isInteger(v) && v >= 0 ? v : 0;
  } catch {
    return 0;
  }
}

/**
 * At the machine, in large type: the size to bore to, the pass the bar is on (kept on this tablet
 * as the machinist steps through them), and the bore sheet's cautions, always in view.
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
            <button mat-stroked-button type="button" [disabled]="i === 0" (click)="go(i - 1)">
              <mat-icon>undo</mat-icon>
              Previous pass
            </button>
            <button
              mat-flat-button
              type="button"
              [disabled]="i >= s.passes.length"
              (click)="go(i + 1)"
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
  /** Which pass the bar is on; kept per cylinder on this device. */
  protected readonly current = linkedSignal(() => storedPass(this.jobId(), this.n()));

  protected go(index: number): void {
    const passes = this.loaded.value()?.passes.length ?? 0;
    const next = Math.max(0, Math.min(index, passes));
    this.current.set(next);
    try {
      localStorage.setItem(passKey(this.jobId(), this.n()), String(next));
    } catch {
      // Kept for this visit only where the browser keeps nothing.
    }
  }
}
