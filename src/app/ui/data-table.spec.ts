import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { PageEvent } from '@angular/material/paginator';
import type { Sort } from '@angular/material/sort';

import { DataTable, type TablePages } from './data-table';
import { TableActions, TableColumn, TableEmpty, titleOf } from './table-column';

interface Part {
  sku: string;
  description: string;
  onHand: number;
}

const PARTS: Part[] = [
  { sku: 'QX-100', description: 'Piston, first step', onHand: 4 },
  { sku: 'QX-200', description: 'Ring set, second step', onHand: 12 },
];

/** A paged list as the table reads it, recording what the table asks of it. */
class FakePages implements TablePages<Part> {
  readonly sorts: Sort[] = [];
  readonly pages: PageEvent[] = [];
  readonly rows = signal<Part[]>(PARTS);
  readonly sort = signal<Sort>({ active: 'sku', direction: 'asc' });
  readonly total = signal(60);
  readonly pageIndex = signal(0);
  readonly pageSize = signal(25);
  onSort(sort: Sort): void {
    this.sorts.push(sort);
  }
  onPage(event: PageEvent): void {
    this.pages.push(event);
  }
}

@Component({
  imports: [DataTable, TableColumn, TableEmpty],
  template: `
    <app-data-table
      caption="Parts on the shelf"
      [columns]="columns()"
      [list]="list"
      pagesLabel="Pages of parts"
      (open)="opened.push($event)"
    >
      <ng-template tableColumn="sku" header="Part" sort [cellTitle]="partTitle" let-p>{{
        p.sku
      }}</ng-template>
      <ng-template tableColumn="onHand" header="On hand" num let-p>{{ p.onHand }}</ng-template>
      <ng-template tableColumn="actions" header="Actions" headerHidden let-p>…</ng-template>
      <ng-template tableEmpty>Nothing on the shelf.</ng-template>
    </app-data-table>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class ListHost {
  readonly list = new FakePages();
  readonly columns = signal(['sku', 'onHand', 'actions']);
  readonly partTitle = titleOf('description');
  readonly opened: Part[] = [];
}

@Component({
  imports: [DataTable, TableColumn],
  template: `
    <app-data-table
      look="figures"
      caption="Stock by part"
      [columns]="['sku', 'onHand']"
      [rows]="rows"
      totals
    >
      <ng-template tableColumn="sku" header="Part" footer="Total" let-p>{{ p.sku }}</ng-template>
      <ng-template tableColumn="onHand" header="On hand" num footer="16" let-p>{{
        p.onHand
      }}</ng-template>
    </app-data-table>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class FiguresHost {
  readonly rows = PARTS;
}

@Component({
  imports: [DataTable, TableActions, TableColumn],
  template: `
    <app-data-table caption="Parts" [columns]="['sku', 'actions']" [rows]="rows" [rowClass]="look">
      <ng-template tableColumn="sku" header="Part" let-p>{{ p.sku }}</ng-template>
      <ng-template tableActions let-p
        ><button type="button">Count {{ p.sku }}</button></ng-template
      >
    </app-data-table>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class ActionsHost {
  readonly rows = PARTS;
  readonly look = (p: Part) => (p.onHand > 10 ? 'faded' : '');
}

function texts(root: HTMLElement, selector: string): string[] {
  return Array.from(root.querySelectorAll(selector)).map((e) => (e.textContent ?? '').trim());
}

describe('DataTable', () => {
  describe('a paged list', () => {
    let fixture: ComponentFixture<ListHost>;
    let root: HTMLElement;

    beforeEach(async () => {
      fixture = TestBed.createComponent(ListHost);
      await fixture.whenStable();
      root = fixture.nativeElement as HTMLElement;
    });

    it('when it shows, then it has the caption, the columns in order and a cell per row', () => {
      expect(texts(root, 'caption')).toEqual(['Parts on the shelf']);
      expect(texts(root, 'th')).toEqual(['Part', 'On hand', 'Actions']);
      expect(root.querySelector('th.mat-column-actions .visually-hidden')?.textContent).toBe(
        'Actions',
      );
      expect(texts(root, 'td.mat-column-sku')).toEqual(['QX-100', 'QX-200']);
      expect(root.querySelector('td.mat-column-sku')?.getAttribute('title')).toBe(
        'Piston, first step',
      );
      expect(root.querySelector('td.mat-column-onHand')?.classList).toContain('num');
      expect(root.querySelector('.table-scroll table')).not.toBeNull();
    });

    it('when a column is left out of the list, then it is not shown', async () => {
      fixture.componentInstance.columns.set(['sku', 'actions']);
      await fixture.whenStable();
      expect(texts(root, 'th')).toEqual(['Part', 'Actions']);
    });

    it('when a sortable header is clicked, then the list is asked to sort by it', async () => {
      root.querySelector<HTMLElement>('th.mat-column-sku')?.click();
      await fixture.whenStable();
      expect(fixture.componentInstance.list.sorts).toEqual([{ active: 'sku', direction: 'desc' }]);
      expect(root.querySelector('th.mat-column-onHand.mat-sort-header')).toBeNull();
    });

    it('when a row is double-clicked, then it opens', async () => {
      root.querySelector<HTMLElement>('tr.mat-mdc-row')?.dispatchEvent(new MouseEvent('dblclick'));
      expect(fixture.componentInstance.opened).toEqual([PARTS[0]]);
    });

    it('when the list has more than a page, then the paginator shows its total and pages on', async () => {
      const paginator = root.querySelector('mat-paginator');
      expect(paginator?.getAttribute('aria-label')).toBe('Pages of parts');
      expect(paginator?.textContent).toContain('1 – 25 of 60');
      paginator?.querySelector<HTMLElement>('button.mat-mdc-paginator-navigation-next')?.click();
      await fixture.whenStable();
      expect(fixture.componentInstance.list.pages[0]).toMatchObject({ pageIndex: 1, pageSize: 25 });
    });

    it('when the list is empty, then the empty row says so across every column', async () => {
      fixture.componentInstance.list.rows.set([]);
      await fixture.whenStable();
      const empty = root.querySelector('td.empty');
      expect(empty?.textContent?.trim()).toBe('Nothing on the shelf.');
      expect(empty?.getAttribute('colspan')).toBe('3');
    });
  });

  describe('the row buttons and row looks', () => {
    it('when the buttons are a tableActions template, then they are the actions column, named for screen readers and left off paper', async () => {
      const fixture = TestBed.createComponent(ActionsHost);
      await fixture.whenStable();
      const root = fixture.nativeElement as HTMLElement;
      expect(texts(root, 'th')).toEqual(['Part', 'Actions']);
      expect(root.querySelector('th.mat-column-actions .visually-hidden')?.textContent).toBe(
        'Actions',
      );
      expect(texts(root, 'td.mat-column-actions')).toEqual(['Count QX-100', 'Count QX-200']);
      const cell = root.querySelector('td.mat-column-actions');
      expect(cell?.classList.contains('actions')).toBe(true);
      expect(cell?.classList.contains('no-print')).toBe(true);
      const rows = Array.from(root.querySelectorAll('tr.mat-mdc-row'));
      expect(rows.map((r) => r.classList.contains('faded'))).toEqual([false, true]);
    });
  });

  describe('the figures look', () => {
    it('when it has totals, then figures align right and the total row shows, without a paginator', async () => {
      const fixture = TestBed.createComponent(FiguresHost);
      await fixture.whenStable();
      const root = fixture.nativeElement as HTMLElement;
      expect(root.querySelector('table.insight')).not.toBeNull();
      expect(root.querySelector('.table-scroll')).toBeNull();
      expect(root.querySelector('th.mat-column-onHand')?.classList).toContain('num');
      expect(texts(root, 'td.mat-mdc-footer-cell')).toEqual(['Total', '16']);
      expect(root.querySelector('mat-paginator')).toBeNull();
    });
  });
});
