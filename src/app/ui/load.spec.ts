import { HttpErrorResponse } from '@angular/common/http';
import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Subject, type Observable } from 'rxjs';

import { loadById, loadEach } from './load';

/** A data service whose answers the test hands out one by one, in any order it likes. */
class FakeRecords {
  readonly asked: { id: string; answer: Subject<{ id: string; name: string }> }[] = [];

  get(id: string): Observable<{ id: string; name: string }> {
    const answer = new Subject<{ id: string; name: string }>();
    this.asked.push({ id, answer });
    return answer;
  }

  answer(index: number, name: string): void {
    const { id, answer } = this.asked[index];
    answer.next({ id, name });
    answer.complete();
  }

  fail(index: number, message: string): void {
    this.asked[index].answer.error(
      new HttpErrorResponse({ status: 404, error: { error: { code: 'not_found', message } } }),
    );
  }
}

function inContext<T>(make: () => T): T {
  return TestBed.runInInjectionContext(make);
}

describe('loadEach and loadById', () => {
  let fake: FakeRecords;

  beforeEach(() => {
    TestBed.configureTestingModule({});
    fake = new FakeRecords();
  });

  it('when the record arrives, then value holds it and loading ends', () => {
    const id = signal('r1');
    const loaded = inContext(() => loadById(id, (i) => fake.get(i)));
    expect(loaded.loading()).toBe(true);
    TestBed.tick();
    expect(fake.asked.map((a) => a.id)).toEqual(['r1']);
    fake.answer(0, 'First');
    expect(loaded.value()).toEqual({ id: 'r1', name: 'First' });
    expect(loaded.loading()).toBe(false);
    expect(loaded.error()).toBe('');
  });

  it('when the id changes before the old answer is in, then the old answer is ignored', () => {
    const id = signal('r1');
    const loaded = inContext(() => loadById(id, (i) => fake.get(i)));
    TestBed.tick();
    id.set('r2');
    TestBed.tick();
    fake.answer(1, 'Second');
    // The slow first answer comes last; switchMap has already let go of it.
    expect(fake.asked[0].answer.observed).toBe(false);
    fake.answer(0, 'First, late');
    expect(loaded.value()).toEqual({ id: 'r2', name: 'Second' });
    expect(loaded.loading()).toBe(false);
  });

  it('when a request fails, then the error shows, the value is gone, and reload asks again', () => {
    const id = signal('r1');
    const loaded = inContext(() => loadById(id, (i) => fake.get(i)));
    TestBed.tick();
    fake.fail(0, 'That record is not there.');
    expect(loaded.error()).toBe('That record is not there.');
    expect(loaded.value()).toBeNull();
    expect(loaded.loading()).toBe(false);

    loaded.reload();
    TestBed.tick();
    expect(fake.asked.map((a) => a.id)).toEqual(['r1', 'r1']);
    // While asking again the message stays, so it does not flash off and on.
    expect(loaded.loading()).toBe(true);
    expect(loaded.error()).toBe('That record is not there.');
    fake.answer(1, 'Back');
    expect(loaded.error()).toBe('');
    expect(loaded.value()).toEqual({ id: 'r1', name: 'Back' });
  });

  it('when there is no id yet, then nothing is asked and nothing is loading', () => {
    const id = signal<string | null>(null);
    const loaded = inContext(() => loadById(id, (i) => fake.get(i)));
    TestBed.tick();
    expect(fake.asked).toEqual([]);
    expect(loaded.loading()).toBe(false);
    expect(loaded.value()).toBeNull();
    id.set('r3');
    TestBed.tick();
    expect(fake.asked.map((a) => a.id)).toEqual(['r3']);
  });

  it('when an action sets the saved record, then it shows without another request', () => {
    const loaded = inContext(() => loadById(signal('r1'), (i) => fake.get(i)));
    TestBed.tick();
    fake.answer(0, 'First');
    loaded.set({ id: 'r1', name: 'Renamed' });
    TestBed.tick();
    expect(loaded.value()).toEqual({ id: 'r1', name: 'Renamed' });
    expect(fake.asked.length).toBe(1);
  });

  it('when the parameters recompute to an equal value, then no new request is made', () => {
    const id = signal('r1');
    const other = signal(0);
    const loaded = inContext(() =>
      loadEach(
        () => ({ id: id(), other: other() }),
        (p) => fake.get(p.id),
        { equal: (a, b) => a.id === b.id },
      ),
    );
    TestBed.tick();
    other.set(1);
    TestBed.tick();
    expect(fake.asked.length).toBe(1);
    loaded.reload();
    TestBed.tick();
    expect(fake.asked.length).toBe(2);
  });
});
