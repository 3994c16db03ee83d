import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  inject,
  input,
  output,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { filter } from 'rxjs';

import { ShopDatePipe } from '../core/shop-date-pipe';
import { BenchQueue, type WaitingEntry } from './bench-queue';

/**
 * What this cylinder has waiting to be sent, and what the server refused: which entry, why, and
 * both versions, with the machinist's choice. Shown on the cylinder page and the bore sheet.
 */
@Component({
  selector: 'app-waiting-entries',
  imports: [MatButtonModule, MatIconModule, ShopDatePipe],
  template: `
    @for (entry of entries(); track entry.key) {
      @if (entry.refusal; as r) {
        <section class="entry refused" role="alert" [attr.aria-label]="title(entry) + ' refused'">
          <h3><mat-icon aria-hidden="true">report</mat-icon>{{ title(entry) }} — not saved</h3>
          <p class="why">{{ r.message }}</p>
          <div class="both">
            <div>
              <h4>Yours, typed {{ entry.typedAt | shopDate: 'datetime' }}</h4>
              <ul>
                @for (line of r.yours; track line) {
                  <li>{{ line }}</li>
                }
              </ul>
            </div>
            @if (r.theirs.length) {
              <div>
                <h4>On the server now</h4>
                <ul>
                  @for (line of r.theirs; track line) {
                    <li>{{ line }}</li>
                  }
                </ul>
              </div>
            }
          </div>
          <div class="actions">
            @if (r.rebase !== undefined) {
              <button mat-flat-button type="button" (click)="keepMine(entry)">
                <mat-icon>upload</mat-icon>Keep mine
              </button>
              <button mat-stroked-button type="button" (click)="useTheirs(entry)">
                <mat-icon>cloud_done</mat-icon>Use theirs
              </button>
            } @else {
              <button mat-stroked-button type="button" (click)="useTheirs(entry)">
                <mat-icon>delete</mat-icon>Drop it
              </button>
            }
          </div>
        </section>
      } @else {
        <p class="entry waiting" role="status">
          <mat-icon aria-hidden="true">schedule_send</mat-icon>
          <span
            ><strong>{{ title(entry) }}: waiting to send</strong> (typed
            {{ entry.typedAt | shopDate: 'datetime' }}); it goes when the network is back.</span
          >
        </p>
      }
    }
  `,
  styles: `
    :host {
      display: grid;
      gap: 12px;
    }
    :host:empty {
      display: none;
    }
    .entry {
      margin: 0;
      padding: 12px 16px;
      border-radius: var(--mat-sys-corner-medium);
    }
    .waiting {
      display: flex;
      align-items: center;
      gap: 12px;
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    .refused {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    h3 {
      display: flex;
      align-items: center;
      gap: 8px;
      margin: 0 0 8px;
      font: var(--mat-sys-title-medium);
    }
    h4 {
      margin: 0 0 4px;
      font: var(--mat-sys-label-large);
    }
    .why {
      margin: 0 0 8px;
    }
    .both {
      display: flex;
      flex-wrap: wrap;
      gap: 8px 32px;
    }
    ul {
      margin: 0;
      padding-left: 20px;
    }
    .actions {
      display: flex;
      flex-wrap: wrap;
      gap: 12px;
      margin-top: 12px;
    }
    .actions button {
      min-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class WaitingEntries {
  private readonly queue = inject(BenchQueue);

  readonly jobId = input.required<string>();
  readonly cylinder = input.required<number>();
  /** An entry of this cylinder was stored by the server, or the server's version chosen. */
  readonly changed = output<void>();

  protected readonly entries = computed(() =>
    this.queue.entries().filter((e) => e.jobId === this.jobId() && e.cylinder === this.cylinder()),
  );

  constructor() {
    this.queue.sent
      .pipe(
        filter((e) => e.jobId === this.jobId() && e.cylinder === this.cylinder()),
        takeUntilDestroyed(inject(DestroyRef)),
      )
      .subscribe(() => this.changed.emit());
  }

  protected title(entry: WaitingEntry): string {
    const what = {
      readings: 'Bore readings',
      finish: 'Sizes after honing',
      passes: 'Passes done',
    }[entry.kind];
    return `${what} for cylinder ${entry.cylinder} of ${entry.jobNumber}`;
  }

  protected keepMine(entry: WaitingEntry): void {
    void this.queue.keepMine(entry);
  }

  protected useTheirs(entry: WaitingEntry): void {
    void this.queue.drop(entry).then(() => this.changed.emit());
  }
}
