import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
} from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';

import type {
  CommitJson,
  DuplicateJson,
  ImportJson,
  ImportStatus,
} from '../../../shared/api/suppliers';
import { apiErrorMessage } from '../core/api-error';
import { ImportCommit } from './import-commit';
import { ImportPreview } from './import-preview';
import { ImportsApi } from './imports-api';
import { STATUS_WORDS } from './import-words';
import { ShopDatePipe } from '../core/shop-date-pipe';

type Loaded =
  { state: 'loading' } | { state: 'ok'; entry: ImportJson } | { state: 'error'; message: string };

/** One list from the log: what it held and changed; a list read but not applied can be applied here. */
@Component({
  selector: 'app-import-detail',
  imports: [
    ShopDatePipe,
    ImportCommit,
    ImportPreview,
    MatIconModule,
    MatProgressBarModule,
    RouterLink,
  ],
  template: `
    <section class="page">
      <nav class="crumbs no-print" aria-label="Breadcrumb">
        <a routerLink="/imports">Price-list log</a>
      </nav>
      @switch (loaded().state) {
        @case ('loading') {
          <mat-progress-bar mode="indeterminate" aria-label="Loading the list" />
        }
        @case ('error') {
          <div class="form-alert" role="alert">
            <mat-icon>error</mat-icon>
            <span>{{ $any(loaded()).message }}</span>
          </div>
        }
        @case ('ok') {
          @let e = entry()!;
          <header class="page-header">
            <h1>{{ e.fileName }}</h1>
          </header>
          <p class="intro">
            <a [routerLink]="['/suppliers', e.supplierId]">{{ e.supplierName }}</a> · uploaded
            {{ e.uploadedAt | shopDate: 'datetime' }} by {{ e.uploadedBy?.name ?? '—' }} ·
            {{ statusText(e.status) }}
            @if (e.committedAt) {
              on {{ e.committedAt | shopDate: 'datetime' }} by {{ e.committedBy?.name ?? '—' }}
            }
          </p>
          @if (e.failure) {
            <div class="form-alert" role="alert">
              <mat-icon>error</mat-icon>
              <span>{{ e.failure }}</span>
            </div>
          }
          <app-import-preview [preview]="e" />
          @if (e.status === 'previewed' || e.status === 'failed') {
            <app-import-commit [preview]="e" (committed)="onCommitted($event)" />
          }
        }
      }
    </section>
  `,
  styles: `
    .intro {
      margin: 0 0 16px;
      color: var(--mat-sys-on-surface-variant);
    }
    .crumbs {
      margin-bottom: 8px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportDetail {
  private readonly api = inject(ImportsApi);

  /** The import id from the route. */
  readonly id = input.required<string>();

  protected readonly loaded = signal<Loaded>({ state: 'loading' });
  protected readonly entry = computed(() => {
    const loaded = this.loaded();
    return loaded.state === 'ok' ? loaded.entry : null;
  });

  constructor() {
    effect(() => this.load(this.id()));
  }

  protected statusText(status: ImportStatus): string {
    return STATUS_WORDS[status];
  }

  protected onCommitted(_answer: CommitJson | DuplicateJson): void {
    this.load(this.id());
  }

  private load(id: string): void {
    this.api.importOf(id).subscribe({
      next: (entry) => this.loaded.set({ state: 'ok', entry }),
      error: (error: unknown) =>
        this.loaded.set({ state: 'error', message: apiErrorMessage(error) }),
    });
  }
}
