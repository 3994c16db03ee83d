import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
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
import { ListState } from '../ui/list-state';

type StatusFilter = UnitStatus | 'on-shelf' | '';
const UNIT_SORT = ['label', 'sku', 'skirt', 'status', 'bin', 'receivedAt'] as const;
type UnitSort = (typeof UNIT_SORT)[number];
type UnitFilters = { partId: string; binId: string; status: StatusFilter };

/** Every measured piston, one row each: its size, where it sits and whether it is free. */
@Component({
  selector: 'app-unit-list',
  imports: [
    CameraScanButton,
    ListState,
    MatTooltipModule,
    ShopDatePipe,
    LengthPipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatMenuModule,
    MatPaginatorModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
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

  protected readonly columns = ['label', 'part', 'skirt', 'status', 'bin', 'receivedAt', 'actions'];
  protected readonly statusLabels = STATUS_LABELS;
  protected readonly statuses: UnitStatus[] = ['free', 'held', 'issued', 'returned', 'scrapped'];
  protected readonly pageSizes = [25, 50, 100];

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
