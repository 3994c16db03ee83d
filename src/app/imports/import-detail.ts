import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { RouterLink } from '@angular/router';

import type { CommitJson, DuplicateJson, ImportStatus } from '../../../shared/api/suppliers';
import { ImportCommit } from './import-commit';
import { ImportPreview } from './import-preview';
import { ImportsApi } from './imports-api';
import { STATUS_WORDS } from './import-words';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { loadById } from '../ui/load';
import { ListState } from '../ui/list-state';
import { FormAlert } from '../ui/form-alert';

/** One list from the log: what it held and changed; a list read but not applied can be applied here. */
@Component({
  selector: 'app-import-detail',
  imports: [FormAlert, ListState, ShopDatePipe, ImportCommit, ImportPreview, RouterLink],
  template: `
    <section class="page">
      <nav class="crumbs no-print" aria-label="Breadcrumb">
        <a routerLink="/imports">Price-list log</a>
      </nav>
      <app-list-state [list]="loaded" progressLabel="Loading the list" [retryable]="false" />
      @if (entry(); as e) {
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
        <app-form-alert [message]="e.failure" />
        <app-import-preview [preview]="e" />
        @if (e.status === 'previewed' || e.status === 'failed') {
          <app-import-commit [preview]="e" (committed)="onCommitted($event)" />
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

  protected readonly loaded = loadById(this.id, (id) => this.api.importOf(id));
  protected readonly entry = this.loaded.value;

  protected statusText(status: ImportStatus): string {
    return STATUS_WORDS[status];
  }

  /** A list just applied reads differently now: ask for it again. */
  protected onCommitted(_answer: CommitJson | DuplicateJson): void {
    this.loaded.reload();
  }
}
