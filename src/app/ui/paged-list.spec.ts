import { TestBed } from '@angular/core/testing';
import { Subject, type Observable } from 'rxjs';

import type { Page } from '../../../shared/api/common';
import { PagedList, type ListRequest } from './paged-list';

type Filters = { state: 'open' | 'closed' | ''; low: boolean };
type Request = ListRequest<'name' | 'made', Filters>;

/** A list service that answers when the test says so, remembering what it was asked. */
class FakeList {
  readonly asked: { request: Request; answer: Subject<Page<string>> }[] = [];

  load(request: Request): Observable<Page<string>> {
    const answer = new Subject<Page<string>>();
    this.asked.push({ request, answer });
    return answer;
  }

  answer(index: number, items: string[], total = items.length): void {
    this.asked[index].answer.next({ items, total });
    this.asked[index].answer.complete();
  }

  last(): Request {
    return this.asked[this.asked.length - 1].request;
  }
}

describe('PagedList', () => {
  let fake: FakeList;
  let list: PagedList<string, 'name' | 'made', Filters>;

  beforeEach(() => {
    jest.useFakeTimers();
    TestBed.configureTestingModule({});
    fake = new FakeList();
    list = TestBed.runInInjectionContext(
      () =>
        new PagedList<string, 'name' | 'made', Filters>({
          sortable: ['name', 'made'],
          filters: { state: '', low: true },
          load: (request) => fake.load(request),
        }),
    );
    TestBed.tick();
  });

  afterEach(() => jest.useRealTimers());

  it('when first shown, then it asks for page 1 sorted by the first field, leaving empty filters out', () => {
    expect(fake.asked.map((a) => a.request)).toEqual([
      { low: true, sort: 'name', dir: 'asc', page: 1, pageSize: 25 },
    ]);
    fake.answer(0, ['a', 'b'], 60);
    expect(list.rows()).toEqual(['a', 'b']);
    expect(list.total()).toBe(60);
    expect(list.loading()).toBe(false);
  });

  it('when a filter changes on page 3, then the list goes back to the first page', () => {
    list.onPage({ pageIndex: 2, pageSize: 25, length: 60 });
    TestBed.tick();
    expect(fake.last().page).toBe(3);
    list.setFilters({ state: 'closed' });
    TestBed.tick();
    expect(list.pageIndex()).toBe(0);
    expect(fake.last()).toEqual({
      state: 'closed',
      low: true,
      sort: 'name',
      dir: 'asc',
      page: 1,
      pageSize: 25,
    });
  });

  it('when the sort or the search changes on a later page, then it goes back to the first page', () => {
    list.onPage({ pageIndex: 1, pageSize: 50, length: 60 });
    TestBed.tick();
    list.onSort({ active: 'made', direction: 'desc' });
    TestBed.tick();
    expect(fake.last()).toMatchObject({ sort: 'made', dir: 'desc', page: 1, pageSize: 50 });

    list.onPage({ pageIndex: 1, pageSize: 50, length: 60 });
    TestBed.tick();
    list.onSearch('  ring ');
    TestBed.tick();
    const before = fake.asked.length;
    jest.advanceTimersByTime(250);
    TestBed.tick();
    // One request for the typed text, on the first page, trimmed.
    expect(fake.asked.length).toBe(before + 1);
    expect(fake.last()).toMatchObject({ q: 'ring', page: 1 });
  });

  it('when an older page answers after a newer one, then the older answer is not shown', () => {
    list.onPage({ pageIndex: 1, pageSize: 25, length: 60 });
    TestBed.tick();
    fake.answer(1, ['page 2']);
    fake.answer(0, ['page 1, late']);
    expect(list.rows()).toEqual(['page 2']);
  });

  it('when the list fails, then the error shows and reload asks for the same page again', () => {
    fake.asked[0].answer.error(new Error('down'));
    expect(list.error()).not.toBe('');
    expect(list.rows()).toEqual([]);
    list.reload();
    TestBed.tick();
    expect(fake.asked.length).toBe(2);
    expect(fake.last()).toEqual(fake.asked[0].request);
    fake.answer(1, ['back']);
    expect(list.error()).toBe('');
    expect(list.rows()).toEqual(['back']);
  });
});
