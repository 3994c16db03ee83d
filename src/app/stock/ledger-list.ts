import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

import type { PartDetailJson, PartJson } from '../../../shared/api/catalog';
import {
  LEDGER_KINDS,
  type LedgerJson,
  type LedgerKind,
  type StockChangeJson,
} from '../../../shared/api/stock';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { AdjustDialog } from './adjust-dialog';
import { MoveDialog, type MoveTarget } from './move-dialog';
import { StockApi } from './stock-api';
import { KIND_WORDS } from './stock-words';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { loadById } from '../ui/load';
import { PagedList } from '../ui/paged-list';
import { DataTable } from '../ui/data-table';
import { ListState } from '../ui/list-state';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { choicesOf, FilterSelect, type Choice } from '../ui/list-fields';

type LedgerFilters = { partId: string; unitId: string; kind: LedgerKind | '' };

/** Every stock movement, newest first: who, when, why, how many, at what cost. */
@Component({
  selector: 'app-ledger-list',
  imports: [
    DataTable,
    ListState,
    TableColumn,
    TableEmpty,
    FilterSelect,
    ShopDatePipe,
    MatButtonModule,
    MatIconModule,
    RouterLink,
  ],
  templateUrl: './ledger-list.html',
  styleUrl: './ledger-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LedgerList {
  private readonly api = inject(StockApi);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  /** ?partId=… or ?unitId=… narrow the list to one part or one piston. */
  readonly partId = input<string>();
  readonly unitId = input<string>();

  protected readonly columns = [
    'at',
    'kind',
    'part',
    'quantity',
    'held',
    'bins',
    'cost',
    'who',
    'reason',
  ];
  protected readonly kinds: Choice[] = [
    { value: '', label: 'All movements' },
    ...choicesOf(LEDGER_KINDS, (kind) => KIND_WORDS[kind]),
  ];
  protected readonly canAdjust = computed(() => this.session.may('adjustStock'));
  protected readonly canMove = computed(() => this.session.may('receiveStock'));

  protected readonly list = new PagedList<LedgerJson, never, LedgerFilters>({
    pageSize: 50,
    filters: () => ({ partId: this.partId() ?? '', unitId: this.unitId() ?? '', kind: '' }),
    load: (request) => this.api.ledger(request),
  });

  /** The part the list is narrowed to, shown above it with what can be done to it. */
  protected readonly part = loadById(
    () => this.list.filters().partId || null,
    (id) => this.api.part(id),
  );

  protected kindText(row: LedgerJson): string {
    return KIND_WORDS[row.kind];
  }

  protected showAll(): void {
    this.list.setFilters({ partId: '', unitId: '' });
  }

  /** A correction or a move changes both the part's figures and the list. */
  protected reload(): void {
    this.list.reload();
    this.part.reload();
  }

  protected adjust(part: PartJson | null): void {
    this.dialog
      .open<AdjustDialog, PartJson | null, StockChangeJson>(AdjustDialog, {
        data: part,
        autoFocus: 'first-tabbable',
      })
      .afterClosed()
      .subscribe((change) => {
        if (change) {
          this.notifier.success(`Count corrected: ${change.levels.onHand} on hand.`);
          this.reload();
        }
      });
  }

  protected movePart(part: PartDetailJson): void {
    const data: MoveTarget = { partId: part.id, name: part.sku, binId: part.binId };
    this.dialog
      .open<MoveDialog, MoveTarget, StockChangeJson>(MoveDialog, { data })
      .afterClosed()
      .subscribe((change) => {
        if (change) {
          this.notifier.success(`${part.sku} moved to bin ${change.ledger[0]?.toBin ?? ''}.`);
          this.reload();
        }
      });
  }
}
