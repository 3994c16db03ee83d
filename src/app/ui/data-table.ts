import { NgTemplateOutlet } from '@angular/common';
import {
  booleanAttribute,
  ChangeDetectionStrategy,
  Component,
  computed,
  contentChild,
  contentChildren,
  input,
  output,
} from '@angular/core';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';

import { TableActions, TableColumn, TableEmpty, type ColumnDef } from './table-column';

/** A server-paged list as the table reads it (`PagedList` is one). */
export interface TablePages<Row = unknown> {
  rows(): readonly Row[];
  sort(): Sort;
  onSort(sort: Sort): void;
  total(): number;
  pageIndex(): number;
  pageSize(): number;
  onPage(event: PageEvent): void;
  /** While it loads (or after it failed) the empty row says so instead of the page's words. */
  loading?(): boolean;
  error?(): string;
}

/** Rows may be any record; each page's cell templates know its own. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- as mat-table's own row templates
type Row = any;

/**
 * The app's table: a Material table built from the page's `<ng-template tableColumn>` cells, with
 * a hidden caption for screen readers, sort headers, a designed empty row and, for a paged list,
 * the paginator. Two looks: `list` (the list pages: roomy rows in a bordered box that scrolls
 * sideways) and `figures` (the insight panels: compact rows, right-aligned figures, sticky header
 * and an optional total row).
 */
@Component({
  selector: 'app-data-table',
  imports: [MatPaginatorModule, MatSortModule, MatTableModule, NgTemplateOutlet],
  templateUrl: './data-table.html',
  styleUrl: './data-table.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DataTable {
  readonly caption = input.required<string>();
  /** The columns shown, in order; a column the page leaves out (a role's hidden money) drops out. */
  readonly columns = input.required<readonly string[]>();
  /** A paged list: its rows, sort and pages. Without one, give `rows` (and `sort` to sort). */
  readonly list = input<TablePages | null>(null);
  readonly rows = input<readonly Row[]>([]);
  readonly sort = input<Sort | null>(null);
  readonly look = input<'list' | 'figures'>('list');
  /** Show the total row made of the columns' `footer`s. */
  readonly totals = input(false, { transform: booleanAttribute });
  /** A row opens with one click (and looks clickable); otherwise with a double click. */
  readonly clickable = input(false, { transform: booleanAttribute });
  readonly rowClass = input<((row: Row) => string) | null>(null);
  /** What the paginator is called for screen readers, e.g. "Pages of suppliers". */
  readonly pagesLabel = input('');
  /**
   * Names the table's box as a region a keyboard can reach and scroll ("Table: bores"), for a
   * table that sits among a page's other sections rather than being the page.
   */
  readonly regionLabel = input('');
  /** What the empty row says when the list failed to load. */
  readonly failedText = input('The list could not be loaded.');

  readonly open = output<Row>();
  readonly sortChange = output<Sort>();

  private readonly columnDefs = contentChildren(TableColumn);
  private readonly actions = contentChild(TableActions);
  protected readonly defs = computed<readonly ColumnDef[]>(() => {
    const actions = this.actions();
    return actions ? [...this.columnDefs(), actions] : this.columnDefs();
  });
  protected readonly empty = contentChild(TableEmpty);
  protected readonly pageSizes = [25, 50, 100];
  protected readonly shownRows = computed(() => this.list()?.rows() ?? this.rows());
  protected readonly activeSort = computed(() => this.list()?.sort() ?? this.sort());

  protected sorted(sort: Sort): void {
    this.list()?.onSort(sort);
    this.sortChange.emit(sort);
  }

  protected clicked(row: Row): void {
    if (this.clickable()) this.open.emit(row);
  }

  protected doubleClicked(row: Row): void {
    if (!this.clickable()) this.open.emit(row);
  }
}
