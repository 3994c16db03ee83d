import { booleanAttribute, Directive, inject, input, TemplateRef } from '@angular/core';

/** What a cell's tooltip says for its row; null for none. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- each table has its own row type, as mat-table's cell templates do
export type CellTitle = (row: any) => string | null | undefined;

/** What the table reads of each column. */
export interface ColumnDef {
  name(): string;
  header(): string;
  headerHidden(): boolean;
  sort(): boolean;
  num(): boolean;
  cellClass(): string;
  cellTitle(): CellTitle | null;
  footer(): string;
  readonly template: TemplateRef<unknown>;
}

/**
 * One column of an `<app-data-table>`, written as the template of its cell:
 * `<ng-template tableColumn="units" header="Units" num let-r>{{ count(r.units) }}</ng-template>`.
 * The page lists which columns show, and in what order, in the table's `columns`.
 */
@Directive({ selector: 'ng-template[tableColumn]' })
export class TableColumn implements ColumnDef {
  readonly name = input.required<string>({ alias: 'tableColumn' });
  readonly header = input.required<string>();
  /** The header's words are for screen readers only (an actions column). */
  readonly headerHidden = input(false, { transform: booleanAttribute });
  /** The header sorts the table (the table's `sort` says by which column and which way). */
  readonly sort = input(false, { transform: booleanAttribute });
  /** A figure: tabular digits that do not wrap (and, in the figures look, right-aligned). */
  readonly num = input(false, { transform: booleanAttribute });
  readonly cellClass = input('');
  readonly cellTitle = input<CellTitle | null>(null);
  /** The cell of the total row, in a table with `totals`. */
  readonly footer = input('');
  readonly template = inject(TemplateRef);
}

/**
 * The row's buttons, the last column of most list tables: `<ng-template tableActions let-u>…`.
 * It is the column 'actions' in the table's `columns`; its header is for screen readers only, its
 * cell keeps the buttons on one line at the right, and it stays off paper (nothing to press there).
 */
@Directive({ selector: 'ng-template[tableActions]' })
export class TableActions implements ColumnDef {
  readonly name = () => 'actions';
  readonly header = () => 'Actions';
  readonly headerHidden = () => true;
  readonly sort = () => false;
  readonly num = () => false;
  readonly cellClass = () => 'actions no-print';
  readonly cellTitle = () => null;
  readonly footer = () => '';
  readonly template = inject(TemplateRef);
}

/** A cell title that shows one field of the row (the part's description, the family's name…). */
export function titleOf(field: string): CellTitle {
  return (row) => row?.[field] ?? null;
}

/** The words of the table's empty row: `<ng-template tableEmpty>No parts yet.</ng-template>`. */
@Directive({ selector: 'ng-template[tableEmpty]' })
export class TableEmpty {
  readonly template = inject(TemplateRef);
}
