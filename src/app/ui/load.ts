import { computed, effect, linkedSignal, signal, untracked, type Signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import {
  catchError,
  debounceTime,
  distinctUntilChanged,
  map,
  of,
  scan,
  startWith,
  switchMap,
  type Observable,
} from 'rxjs';

import { apiErrorMessage } from '../core/api-error';

/**
 * What every page loader hands the template. One shape for detail pages, insight figures and lists,
 * so a page reads the same whichever loader filled it, and `<app-list-state>` can show any of them.
 */
export interface Loaded<T> {
  /** The last answer; kept while a newer one loads, so the page does not blink away. */
  readonly value: Signal<T | null>;
  readonly loading: Signal<boolean>;
  /**
   * A sentence to show, or '' when the last request succeeded. Kept while "Try again" runs, so the
   * message does not flash off and on when the server is still down.
   */
  readonly error: Signal<string>;
  reload(): void;
  /** Puts an action's answer (the saved record) on screen without asking the server again. */
  set(value: T): void;
}

export interface LoadOptions<P> {
  /**
   * When two parameter values ask for the same thing. Default Object.is; give one when the
   * parameters are an object recomputed from signals that change more often than the answer would.
   */
  equal?: (a: P, b: P) => boolean;
}

interface State<T> {
  value: T | null;
  loading: boolean;
  error: string;
}

type Answer<T> =
  | { kind: 'loading' }
  | { kind: 'ok'; value: T }
  | { kind: 'failed'; message: string }
  | { kind: 'none' };

function next<T>(state: State<T>, answer: Answer<T>): State<T> {
  switch (answer.kind) {
    case 'loading':
      return { ...state, loading: true };
    case 'ok':
      return { value: answer.value, loading: false, error: '' };
    case 'failed':
      // A failed answer says nothing about the record any more: showing the old one would mislead.
      return { value: null, loading: false, error: answer.message };
    case 'none':
      return { value: null, loading: false, error: '' };
  }
}

/**
 * Asks the server again whenever the parameters change or `reload()` is called; a newer request
 * cancels the one still running (switchMap), so a slow old answer never overwrites a newer one.
 * Parameters of null or undefined mean "nothing to load yet": no request, no value, no error.
 * Call in an injection context (a field initializer).
 */
export function loadEach<P, T>(
  params: () => P,
  fetch: (p: NonNullable<P>) => Observable<T>,
  options: LoadOptions<P> = {},
): Loaded<T> {
  const reloads = signal(0);
  const key = computed(params, { equal: options.equal });
  const trigger = computed(() => ({ p: key(), n: reloads() }));
  const initial: State<T> = { value: null, loading: true, error: '' };
  const state = toSignal(
    toObservable(trigger).pipe(
      switchMap(({ p }) =>
        p === null || p === undefined
          ? of<Answer<T>>({ kind: 'none' })
          : fetch(p).pipe(
              map((value): Answer<T> => ({ kind: 'ok', value })),
              catchError((error: unknown) =>
                of<Answer<T>>({ kind: 'failed', message: apiErrorMessage(error) }),
              ),
              startWith<Answer<T>>({ kind: 'loading' }),
            ),
      ),
      scan(next<T>, initial),
    ),
    { initialValue: initial },
  );
  const value = linkedSignal(() => state().value);
  return {
    value: value.asReadonly(),
    loading: computed(() => state().loading),
    error: computed(() => state().error),
    reload: () => reloads.update((n) => n + 1),
    set: (v: T) => value.set(v),
  };
}

/**
 * A detail page: the record with this id (a route parameter bound as an input, or any signal).
 * The same as loadEach, named for what most pages do, with the id typed as the thing it is.
 */
export function loadById<T>(
  id: () => string | null | undefined,
  fetch: (id: string) => Observable<T>,
): Loaded<T> {
  return loadEach(id, fetch);
}

/**
 * An edit form's record: loadById, and `fill` puts each record that arrives (or that a save sets)
 * into the form. No id: a new record, nothing to load and nothing to fill.
 */
export function loadIntoForm<T>(
  id: () => string | null | undefined,
  fetch: (id: string) => Observable<T>,
  fill: (record: T) => void,
): Loaded<T> {
  const loaded = loadById(id, fetch);
  effect(() => {
    const record = loaded.value();
    // The form is not the loader's business: reading it must not make this effect rerun.
    if (record) untracked(() => fill(record));
  });
  return loaded;
}

/**
 * Search text as the server should see it: trimmed, and only once typing pauses, so each key
 * press does not cost a request. Call in an injection context.
 */
export function debounced(text: Signal<string>, ms = 250): Signal<string> {
  return toSignal(
    toObservable(text).pipe(
      debounceTime(ms),
      map((t) => t.trim()),
      distinctUntilChanged(),
    ),
    { initialValue: '' },
  );
}
