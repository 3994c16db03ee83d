import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { catchError, EMPTY, finalize, interval, Subject, switchMap, takeUntil } from 'rxjs';

import type {
  CommitJson,
  DuplicateJson,
  ImportJson,
  ImportProgressJson,
} from '../../../shared/api/suppliers';
import { apiErrorMessage } from '../core/api-error';
import { ImportsApi } from './imports-api';
import { FormAlert } from '../ui/form-alert';

/** Applies a read price list, all of it or nothing, showing what the server is doing meanwhile. */
@Component({
  selector: 'app-import-commit',
  imports: [
    FormAlert,
    FormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatIconModule,
    MatProgressBarModule,
  ],
  template: `
    <div class="commit" aria-live="polite">
      <mat-checkbox [(ngModel)]="fullList" [disabled]="busy()">
        This is their whole list: mark items it no longer holds as dropped ({{
          preview().counts.missing
        }})
      </mat-checkbox>
      <div class="row">
        <button
          mat-flat-button
          type="button"
          (click)="commit()"
          [disabled]="busy() || preview().counts.ok === 0"
        >
          <mat-icon>done_all</mat-icon>
          Apply {{ preview().counts.ok }} rows
        </button>
        @if (preview().counts.errors > 0) {
          <span class="muted">{{ preview().counts.errors }} rows with errors are left out.</span>
        }
      </div>
      @if (busy()) {
        <mat-progress-bar mode="indeterminate" aria-label="Applying the price list" />
        <p class="muted">{{ phaseText() }}</p>
      }
      <app-form-alert [message]="problem()" />
    </div>
  `,
  styles: `
    .commit {
      display: flex;
      flex-direction: column;
      gap: 12px;
      padding: 16px;
      border-radius: var(--mat-sys-corner-medium);
      background: var(--mat-sys-surface-container);
    }
    .row {
      display: flex;
      flex-wrap: wrap;
      gap: 12px;
      align-items: center;
    }
    .muted {
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportCommit {
  private readonly api = inject(ImportsApi);
  private readonly destroyRef = inject(DestroyRef);

  readonly preview = input.required<ImportJson>();
  readonly committed = output<CommitJson | DuplicateJson>();

  protected fullList = true;
  protected readonly busy = signal(false);
  protected readonly problem = signal('');
  private readonly serverProgress = signal<ImportProgressJson | null>(null);

  protected phaseText(): string {
    const p = this.serverProgress();
    if (!p || p.phase === 'waiting') return 'Waiting for the server…';
    return 'Writing prices, price history and dropped items in one go…';
  }

  protected commit(): void {
    if (this.busy()) return;
    this.busy.set(true);
    this.problem.set('');
    const token = crypto.randomUUID();
    const done = new Subject<void>();
    this.destroyRef.onDestroy(() => done.next());
    interval(400)
      .pipe(
        takeUntil(done),
        switchMap(() => this.api.progress(token).pipe(catchError(() => EMPTY))),
      )
      .subscribe((p) => this.serverProgress.set(p));
    this.api
      .commit(this.preview().importId, this.fullList, token)
      .pipe(finalize(() => done.next()))
      .subscribe({
        next: (answer) => {
          this.busy.set(false);
          this.committed.emit(answer);
        },
        error: (error: unknown) => {
          this.busy.set(false);
          this.problem.set(apiErrorMessage(error));
        },
      });
  }
}
