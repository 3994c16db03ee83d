import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  linkedSignal,
  signal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { catchError, map, of, switchMap, tap } from 'rxjs';

import type { PartDetailJson, PartJson } from '../../../shared/api/catalog';
import {
  LEDGER_KINDS,
  type LedgerJson,
  type LedgerKind,
  type StockChangeJson,
} from '../../../shared/api/stock';
import { apiErrorMessage } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { AdjustDialog } from './adjust-dialog';
import { MoveDialog, type MoveTarget } from './move-dialog';
import { StockApi } from './stock-api';
import { KIND_WORDS } from './stock-words';
import { ShopDatePipe } from '../core/shop-date-pipe';
import type { Page } from '../../../shared/api/common';

type Loaded = { ok: true; page: Page<LedgerJson> } | { ok: false; message: string };

/** Every stock movement, newest first: who, when, why, how many, at what cost. */
@Component({
  selector: 'app-ledger-list',
  imports: [
    ShopDatePipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTableModule,
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
  protected readonly kinds = LEDGER_KINDS;
  protected readonly kindWords = KIND_WORDS;
  protected readonly part = signal<PartDetailJson | null>(null);
  protected readonly partFilter = linkedSignal(() => this.partId() ?? '');
  protected readonly unitFilter = linkedSignal(() => this.unitId() ?? '');
  protected readonly kind = signal<LedgerKind | ''>('');
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(50);
  private readonly reloads = signal(0);

  protected readonly canAdjust = computed(() => this.session.may('adjustStock'));
  protected readonly canMove = computed(() => this.session.may('receiveStock'));

  private readonly query = computed(() => ({
    partId: this.partFilter() || undefined,
    unitId: this.unitFilter() || undefined,
    kind: this.kind() || undefined,
    page: this.pageIndex() + 1,
    pageSize: this.pageSize(),
    reload: this.reloads(),
  }));

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    toObservable(this.query).pipe(
      tap(() => this.loading.set(true)),
      switchMap(({ reload: _reload, ...query }) =>
        this.api.ledger(query).pipe(
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

  constructor() {
    effect(() => {
      const id = this.partFilter();
      this.reloads();
      if (!id) {
        this.part.set(null);
        return;
      }
      this.api
        .part(id)
        .subscribe({ next: (p) => this.part.set(p), error: () => this.part.set(null) });
    });
  }

  protected kindText(row: LedgerJson): string {
    return KIND_WORDS[row.kind];
  }

  protected onKind(kind: LedgerKind | ''): void {
    this.kind.set(kind);
    this.pageIndex.set(0);
  }

  protected showAll(): void {
    this.partFilter.set('');
    this.unitFilter.set('');
    this.pageIndex.set(0);
  }

  protected onPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  protected reload(): void {
    this.reloads.update((n) => n + 1);
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
