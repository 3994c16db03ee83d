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
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import {
  catchError,
  debounce,
  distinctUntilChanged,
  map,
  Observable,
  of,
  switchMap,
  tap,
  timer,
} from 'rxjs';

import type { UnitStatus } from '../../../shared/api/catalog';
import type { StockChangeJson, UnitJson } from '../../../shared/api/stock';
import { apiErrorMessage } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { CameraScanButton } from '../ui/camera-scan';
import { looksScanned } from '../ui/scan';
import { MeasureDialog } from './measure-dialog';
import { MoveDialog, type MoveTarget } from './move-dialog';
import { ScrapDialog } from './scrap-dialog';
import { StockApi, type UnitQuery } from './stock-api';
import { STATUS_LABELS } from './stock-words';
import { ShopDatePipe } from '../core/shop-date-pipe';
import type { Page } from '../../../shared/api/common';

type Loaded = { ok: true; page: Page<UnitJson> } | { ok: false; message: string };
type StatusFilter = UnitStatus | 'on-shelf' | '';

/** Every measured piston, one row each: its size, where it sits and whether it is free. */
@Component({
  selector: 'app-unit-list',
  imports: [
    CameraScanButton,
    MatTooltipModule,
    ShopDatePipe,
    LengthPipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatMenuModule,
    MatPaginatorModule,
    MatProgressBarModule,
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

  protected readonly text = linkedSignal(() => this.q() ?? '');
  protected readonly statusFilter = linkedSignal<StatusFilter>(() => {
    const s = this.status();
    return s === '' || s === 'all' ? '' : ((s as StatusFilter | undefined) ?? 'on-shelf');
  });
  protected readonly part = linkedSignal(() => this.partId() ?? '');
  protected readonly bin = linkedSignal(() => this.binId() ?? '');
  protected readonly sort = signal<Sort>({ active: 'label', direction: 'asc' });
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(25);
  private readonly reloads = signal(0);
  private readonly enter = signal(0);

  private readonly searchText = toSignal(
    toObservable(computed(() => ({ text: this.text(), enter: this.enter() }))).pipe(
      debounce((v) => (v.enter && looksScanned(v.text) ? timer(0) : timer(250))),
      map((v) => v.text.trim()),
      distinctUntilChanged(),
    ),
    { initialValue: '' },
  );

  private readonly query = computed(() => {
    const sort = this.sort();
    return {
      q: this.searchText() || undefined,
      partId: this.part() || undefined,
      binId: this.bin() || undefined,
      status: this.statusFilter() || undefined,
      sort: sort.active,
      dir: sort.direction === 'desc' ? 'desc' : 'asc',
      page: this.pageIndex() + 1,
      pageSize: this.pageSize(),
      reload: this.reloads(),
    } satisfies UnitQuery & { reload: number };
  });

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    toObservable(this.query).pipe(
      tap(() => this.loading.set(true)),
      switchMap(({ reload: _reload, ...query }) =>
        this.api.units(query).pipe(
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

  protected onSearch(value: string): void {
    this.text.set(value);
    this.pageIndex.set(0);
  }

  /** A label read by the camera: searched at once, as a wedge scanner's label and Enter are. */
  protected onScanned(label: string): void {
    this.onSearch(label);
    this.onEnter();
  }

  protected onEnter(): void {
    this.enter.update((n) => n + 1);
  }

  protected onStatus(value: StatusFilter): void {
    this.statusFilter.set(value);
    this.pageIndex.set(0);
  }

  protected clearPart(): void {
    this.part.set('');
    this.bin.set('');
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

  protected reload(): void {
    this.reloads.update((n) => n + 1);
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
        this.reload();
      }
    });
  }
}
