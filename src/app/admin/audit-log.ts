import { NgTemplateOutlet } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  linkedSignal,
  signal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDatepickerModule } from '@angular/material/datepicker';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import type { DateTime } from 'luxon';
import { catchError, map, of, switchMap, tap } from 'rxjs';

import {
  AUDIT_ID_FIELDS,
  auditRefKey,
  type AuditEventJson,
  type AuditPageJson,
  type AuditRefJson,
} from '../../../shared/api/audit';
import { apiErrorMessage } from '../core/api-error';
import { dayOf } from '../core/shop-date-adapter';
import { AuditApi, type AuditListQuery } from './audit-api';
import { actionWords, entityWords, fieldChanges, type FieldChange } from './audit-words';
import { ShopDatePipe } from '../core/shop-date-pipe';

type Loaded = { ok: true; page: AuditPageJson } | { ok: false; message: string };

/** "jobId" reads "job", "toBinId" "to bin", "unitPrice" "unit price". */
function idFieldName(field: string): string {
  return field
    .replace(/Id$/, '')
    .replace(/([A-Z])/g, ' $1')
    .toLowerCase();
}

/** A changed field as shown: an id field reads as the record it names ("job CY-…"). */
interface ShownChange extends FieldChange {
  name: string;
  beforeRef: AuditRefJson | null;
  afterRef: AuditRefJson | null;
}

const DAY = /^\d{4}-\d{2}-\d{2}$/;

/** The owner's view of every recorded change: who, when, what it was before and after. */
@Component({
  selector: 'app-audit-log',
  imports: [
    NgTemplateOutlet,
    ShopDatePipe,
    MatButtonModule,
    MatDatepickerModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
    RouterLink,
  ],
  templateUrl: './audit-log.html',
  styleUrl: './audit-log.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AuditLog {
  private readonly api = inject(AuditApi);

  /** ?entity=part&entityId=… open the trail of one record (links from other pages). */
  readonly entity = input<string>();
  readonly entityId = input<string>();

  protected readonly columns = ['at', 'user', 'action', 'record', 'changes'];
  protected readonly pageSizes = [25, 50, 100];
  protected readonly entityWords = entityWords;

  protected readonly entityFilter = linkedSignal(() => this.entity() ?? '');
  protected readonly recordFilter = linkedSignal(() => this.entityId() ?? '');
  protected readonly userFilter = signal('');
  protected readonly from = signal('');
  protected readonly to = signal('');
  protected readonly sort = signal<Sort>({ active: 'at', direction: 'desc' });
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(50);
  private readonly reloads = signal(0);

  /** Filters, sort and page feed one request at a time; a newer one cancels an older one. */
  private readonly query = computed<AuditListQuery & { reload: number }>(() => ({
    entity: this.entityFilter() || undefined,
    entityId: this.recordFilter() || undefined,
    user: this.userFilter() || undefined,
    from: DAY.test(this.from()) ? this.from() : undefined,
    to: DAY.test(this.to()) ? this.to() : undefined,
    dir: this.sort().direction === 'asc' ? 'asc' : 'desc',
    page: this.pageIndex() + 1,
    pageSize: this.pageSize(),
    reload: this.reloads(),
  }));

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    toObservable(this.query).pipe(
      tap(() => this.loading.set(true)),
      switchMap(({ reload: _reload, ...query }) =>
        this.api.page(query).pipe(
          map((page): Loaded => ({ ok: true, page })),
          catchError((error: unknown) =>
            of<Loaded>({ ok: false, message: apiErrorMessage(error) }),
          ),
        ),
      ),
      tap(() => this.loading.set(false)),
    ),
  );

  protected readonly rows = computed(() => {
    const loaded = this.loaded();
    return loaded?.ok ? loaded.page.items : [];
  });
  protected readonly total = computed(() => {
    const loaded = this.loaded();
    return loaded?.ok ? loaded.page.total : 0;
  });
  protected readonly loadError = computed(() => {
    const loaded = this.loaded();
    return loaded && !loaded.ok ? loaded.message : '';
  });
  /** The filter choices stay while a new page loads. */
  protected readonly facets = linkedSignal<Loaded | undefined, AuditPageJson['facets']>({
    source: this.loaded,
    computation: (loaded, previous) =>
      loaded?.ok ? loaded.page.facets : (previous?.value ?? { entities: [], users: [] }),
  });
  protected readonly filtered = computed(
    () =>
      !!(
        this.entityFilter() ||
        this.recordFilter() ||
        this.userFilter() ||
        this.from() ||
        this.to()
      ),
  );

  protected actionText(row: AuditEventJson): string {
    return actionWords(row.action);
  }

  /** The one record the trail is narrowed to, by its label once the server has named it. */
  protected filteredLabel(): string {
    return this.ref(this.entityFilter(), this.recordFilter())?.label ?? this.recordFilter();
  }

  /** The record changed, by its number, SKU, label or name, when the server could name it. */
  protected recordRef(row: AuditEventJson): AuditRefJson | null {
    return row.entityId ? this.ref(row.entity, row.entityId) : null;
  }

  protected changes(row: AuditEventJson): ShownChange[] {
    return fieldChanges(row.before, row.after).map((c) => {
      const kind = AUDIT_ID_FIELDS[c.field];
      const list = (side: unknown) => this.listWords((side as Record<string, unknown>)?.[c.field]);
      return {
        ...c,
        before: list(row.before) ?? c.before,
        after: list(row.after) ?? c.after,
        // "jobId" reads "job", "toBinId" "to bin".
        name: kind ? idFieldName(c.field) : c.field,
        beforeRef: kind && c.before ? this.ref(kind, c.before) : null,
        afterRef: kind && c.after ? this.ref(kind, c.after) : null,
      };
    });
  }

  /**
   * A list of records (an order's lines) in words, each id read as what it names:
   * "part BT-72-RC-050, quantity 3; …". Null when the value is not such a list.
   */
  private listWords(value: unknown): string | null {
    if (!Array.isArray(value) || value.length === 0) return null;
    if (!value.every((v) => v && typeof v === 'object' && !Array.isArray(v))) return null;
    return value
      .map((item: Record<string, unknown>) =>
        Object.entries(item)
          .map(([field, v]) => {
            const kind = AUDIT_ID_FIELDS[field];
            const named = kind && typeof v === 'string' ? this.ref(kind, v)?.label : undefined;
            return `${idFieldName(field)} ${named ?? (typeof v === 'string' ? v : JSON.stringify(v))}`;
          })
          .join(', '),
      )
      .join('; ');
  }

  private ref(kind: string, id: string): AuditRefJson | null {
    const loaded = this.loaded();
    return (loaded?.ok ? loaded.page.refs?.[auditRefKey(kind, id)] : undefined) ?? null;
  }

  protected onEntity(entity: string): void {
    this.entityFilter.set(entity);
    this.recordFilter.set('');
    this.pageIndex.set(0);
  }

  protected onUser(user: string): void {
    this.userFilter.set(user);
    this.pageIndex.set(0);
  }

  protected day(value: DateTime | null): string {
    return dayOf(value) ?? '';
  }

  protected onDay(which: 'from' | 'to', value: string): void {
    (which === 'from' ? this.from : this.to).set(value);
    this.pageIndex.set(0);
  }

  protected onSort(sort: Sort): void {
    this.sort.set(sort);
    this.pageIndex.set(0);
  }

  protected onPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  protected clearFilters(): void {
    this.entityFilter.set('');
    this.recordFilter.set('');
    this.userFilter.set('');
    this.from.set('');
    this.to.set('');
    this.pageIndex.set(0);
  }

  protected reload(): void {
    this.reloads.update((n) => n + 1);
  }
}
