import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';

/**
 * The loading states every list and detail page shows above its content: a slim progress slot that
 * keeps its height (so the page never jumps when a request starts), the error with "Try again", and
 * an empty-state sentence. Feed it a loader's signals (`ui/load.ts`, `ui/paged-list.ts`).
 */
@Component({
  selector: 'app-list-state',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule],
  template: `
    <div class="progress-slot" aria-live="polite">
      @if (loading()) {
        <mat-progress-bar mode="indeterminate" [attr.aria-label]="progressLabel()" />
      }
    </div>
    @if (error()) {
      <div class="form-alert" role="alert">
        <mat-icon>error</mat-icon>
        <span class="grow">{{ error() }}</span>
        @if (retryable()) {
          <button mat-button type="button" (click)="retry.emit()">Try again</button>
        }
      </div>
    } @else if (empty() && !loading() && emptyText()) {
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
}
