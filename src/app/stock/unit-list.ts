import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { RouterLink } from '@angular/router';
import { Observable } from 'rxjs';

import type { UnitStatus } from '../../../shared/api/catalog';
import type { StockChangeJson, UnitJson } from '../../../shared/api/stock';
import { LengthPipe } from '../core/length-pipe';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { CameraScanButton } from '../ui/camera-scan';
import { MeasureDialog } from './measure-dialog';
import { MoveDialog, type MoveTarget } from './move-dialog';
import { ScrapDialog } from './scrap-dialog';
import { StockApi } from './stock-api';
import { STATUS_LABELS } from './stock-words';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { PagedList } from '../ui/paged-list';
import { RowMenu } from '../ui/row-menu';
import { DataTable } from '../ui/data-table';
import { ListState } from '../ui/list-state';
import { TableActions, TableColumn, TableEmpty } from '../ui/table-column';
import { choicesOf, FilterSelect, SearchField, type Choice } from '../ui/list-fields';

type StatusFilter = UnitStatus | 'on-shelf' | '';
const STATUSES: readonly UnitStatus[] = ['free', 'held', 'issued', 'returned', 'scrapped'];
const UNIT_SORT = ['label', 'sku', 'skirt', 'status', 'bin', 'receivedAt'] as const;
type UnitSort = (typeof UNIT_SORT)[number];
type UnitFilters = { partId: string; binId: string; status: StatusFilter };

/** Every measured piston, one row each: its size, where it sits and whether it is free. */
@Component({
  selector: 'app-unit-list',
  imports: [
    DataTable,
    ListState,
    TableActions,
    TableColumn,
    TableEmpty,
    SearchField,
    FilterSelect,
    CameraScanButton,
    RowMenu,
    ShopDatePipe,
    LengthPipe,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    RouterLink,
  ],
  templateUrl: './unit-list.html',
  styleUrl: './unit-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UnitList {
  private readonly api = inject(StockApi);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  /** Filters from the address (?q=PU-000123, ?partId=…, ?status=free). */
  readonly q = input<string>();
  readonly partId = input<string>();
  readonly status = input<string>();
  readonly binId = input<string>();

  /** The part's column is named 'sku': its header sorts by part number, as the server calls it. */
  protected readonly columns = ['label', 'sku', 'skirt', 'status', 'bin', 'receivedAt', 'actions'];
  protected readonly statuses: Choice[] = [
    { value: 'on-shelf', label: 'On the shelf (free or held)' },
    ...choicesOf(STATUSES, (status) => STATUS_LABELS[status].text),
    { value: '', label: 'Any status' },
  ];

  protected readonly canMove = computed(() => this.session.may('receiveStock'));
  protected readonly canScrap = computed(() => this.session.may('scrapUnits'));
  protected readonly canMeasure = computed(() => this.session.may('measureUnits'));

  protected readonly list = new PagedList<UnitJson, UnitSort, UnitFilters>({
    sortable: UNIT_SORT,
    text: () => this.q() ?? '',
    filters: () => {
      const s = this.status();
      return {
        partId: this.partId() ?? '',
        binId: this.binId() ?? '',
        // No ?status= shows what is on the shelf; ?status=all (or empty) shows every piston.
        status: s === '' || s === 'all' ? '' : ((s as StatusFilter | undefined) ?? 'on-shelf'),
      };
    },
    load: (request) => this.api.units(request),
  });
  /** A label read by the camera: searched at once, as a wedge scanner's label and Enter are. */
  protected onScanned(label: string): void {
    this.list.onSearch(label);
    this.list.onEnter();
  }

  protected clearPart(): void {
    this.list.setFilters({ partId: '', binId: '' });
  }

  protected statusOf(unit: UnitJson): { text: string; icon: string } {
    return STATUS_LABELS[unit.status];
  }

  protected onShelf(unit: UnitJson): boolean {
    return unit.status === 'free' || unit.status === 'held';
  }

  protected measure(unit: UnitJson): void {
    this.after(
      this.dialog
        .open<MeasureDialog, UnitJson, StockChangeJson>(MeasureDialog, { data: unit })
        .afterClosed(),
      (change) => `${unit.label}: ${change.ledger[0]?.reason ?? 'measured'}.`,
    );
  }

  protected move(unit: UnitJson): void {
    const data: MoveTarget = { unitId: unit.id, name: unit.label, binId: unit.binId };
    this.after(
      this.dialog.open<MoveDialog, MoveTarget, StockChangeJson>(MoveDialog, { data }).afterClosed(),
      (change) => `${unit.label} moved to bin ${change.unit?.bin ?? ''}.`,
    );
  }

  protected scrap(unit: UnitJson): void {
    this.after(
      this.dialog
        .open<ScrapDialog, UnitJson, StockChangeJson>(ScrapDialog, { data: unit })
        .afterClosed(),
      () => `${unit.label} scrapped.`,
    );
  }

  private after(
    closed: Observable<StockChangeJson | undefined>,
    message: (change: StockChangeJson) => string,
  ): void {
    closed.subscribe((change) => {
      if (change) {
        this.notifier.success(message(change));
        this.list.reload();
      }
    });
  }
}
