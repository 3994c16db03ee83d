import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';

/**
 * The loading states every list and detail page shows above its content: a slim progress slot that
 * keeps its height (so the page never jumps when a request starts), the error with "Try again", and
 * an empty-state sentence. Give it the loader itself (`ui/load.ts`, `ui/paged-list.ts`):
 * `<app-list-state [list]="list" progressLabel="Loading parts" />` shows its `loading()` and
 * `error()` and "Try again" calls its `reload()`; or, for signals of the page's own, `[loading]`,
 * `[error]` and `(retry)`.
 */
/** A loader as the list state reads it: `loadById`, `loadEach` and `PagedList` all are. */
export interface Reloadable {
  loading(): boolean;
  error(): string;
  reload(): void;
}

@Component({
  selector: 'app-list-state',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule],
  template: `
    <div class="progress-slot" aria-live="polite">
      @if (busy()) {
        <mat-progress-bar mode="indeterminate" [attr.aria-label]="progressLabel()" />
      }
    </div>
    @if (problem()) {
      <div class="form-alert" role="alert">
        <mat-icon>error</mat-icon>
        <span class="grow">{{ problem() }}</span>
        @if (retryable()) {
          <button mat-button type="button" (click)="again()">Try again</button>
        }
      </div>
    } @else if (empty() && !busy() && emptyText()) {
      <p class="empty-state">{{ emptyText() }}</p>
    }
  `,
  styles: `
    :host {
      display: block;
    }
    .progress-slot {
      height: 4px;
      margin-bottom: 8px;
    }
    .grow {
      flex: 1 1 auto;
      align-self: center;
    }
    .empty-state {
      margin: 0 0 16px;
      padding: 24px 16px;
      border-radius: var(--mat-sys-corner-medium);
      background: var(--mat-sys-surface-container-low);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ListState {
  /** The page's loader: its own loading, error and reload stand in for the three below. */
  readonly list = input<Reloadable | null>(null);
  readonly loading = input(false);
  /** The loader's sentence; '' when the last request succeeded. */
  readonly error = input('');
  /** What the progress bar says to a screen reader, e.g. "Loading parts". */
  readonly progressLabel = input('Loading');
  /** False where asking again would not help (the page has its own way back). */
  readonly retryable = input(true);
  /** Shown when the answer is empty; pages whose table has its own empty row leave it out. */
  readonly empty = input(false);
  readonly emptyText = input('');
  readonly retry = output<void>();

  protected readonly busy = computed(() => this.list()?.loading() ?? this.loading());
  protected readonly problem = computed(() => this.list()?.error() ?? this.error());

  protected again(): void {
    const list = this.list();
    if (list) list.reload();
    else this.retry.emit();
  }
}
