import { NgTemplateOutlet } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  linkedSignal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';

import {
  AUDIT_ID_FIELDS,
  auditRefKey,
  type AuditEventJson,
  type AuditPageJson,
  type AuditRefJson,
} from '../../../shared/api/audit';
import { DataTable } from '../ui/data-table';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { AuditApi } from './audit-api';
import { actionWords, entityWords, fieldChanges, type FieldChange } from './audit-words';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { PagedList } from '../ui/paged-list';
import { ListState } from '../ui/list-state';
import { FilterDate } from '../ui/filter-date';

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

type AuditFilters = {
  entity: string;
  entityId: string;
  user: string;
  from: string;
  to: string;
};

/** The owner's view of every recorded change: who, when, what it was before and after. */
@Component({
  selector: 'app-audit-log',
  imports: [
    FilterDate,
    ListState,
    NgTemplateOutlet,
    ShopDatePipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatSelectModule,
    DataTable,
    TableColumn,
    TableEmpty,
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
  protected readonly entityWords = entityWords;

  /** Newest first by default; the server sorts by time only, so the list sends the direction. */
  protected readonly list = new PagedList<AuditEventJson, 'at', AuditFilters, AuditPageJson>({
    sortable: ['at'],
    dir: 'desc',
    pageSize: 50,
    filters: () => ({
      entity: this.entity() ?? '',
      entityId: this.entityId() ?? '',
      user: '',
      from: '',
      to: '',
    }),
    // A day still being typed is no filter yet.
    load: ({ sort: _sort, from, to, ...request }) =>
      this.api.page({
        ...request,
        from: from && DAY.test(from) ? from : undefined,
        to: to && DAY.test(to) ? to : undefined,
      }),
  });

  /** The filter choices stay while a new page loads. */
  protected readonly facets = linkedSignal<AuditPageJson | null, AuditPageJson['facets']>({
    source: this.list.value,
    computation: (page, previous) => page?.facets ?? previous?.value ?? { entities: [], users: [] },
  });
  protected readonly filtered = computed(() =>
    Object.values(this.list.filters()).some((value) => value !== ''),
  );

  protected actionText(row: AuditEventJson): string {
    return actionWords(row.action);
  }

  /** The one record the trail is narrowed to, by its label once the server has named it. */
  protected filteredLabel(): string {
    const { entity, entityId } = this.list.filters();
    return this.ref(entity, entityId)?.label ?? entityId;
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
    return this.list.value()?.refs?.[auditRefKey(kind, id)] ?? null;
  }

  protected onEntity(entity: string): void {
    this.list.setFilters({ entity, entityId: '' });
  }

  protected clearFilters(): void {
    this.list.filters.set({ entity: '', entityId: '', user: '', from: '', to: '' });
  }
}
