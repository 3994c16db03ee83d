import { computed, signal, type Signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { catchError, map, of, startWith, switchMap, type Observable } from 'rxjs';

import { apiErrorMessage } from '../core/api-error';

export interface Loaded<T> {
  /** The last answer; kept while a newer one loads, so a chart does not blink away. */
  value: Signal<T | null>;
  loading: Signal<boolean>;
  /** A sentence to show, or '' when the last request succeeded. */
  error: Signal<string>;
  reload(): void;
}

type Step<T> =
  { state: 'loading' } | { state: 'ok'; value: T } | { state: 'failed'; message: string };

/**
 * Asks the server again whenever the parameters change (a newer request cancels an older one).
 * Call in an injection context (a field initializer).
 */
export function loadEach<P, T>(params: () => P, fetch: (p: P) => Observable<T>): Loaded<T> {
  const reloads = signal(0);
  const trigger = computed(() => ({ p: params(), n: reloads() }));
  const steps = toSignal(
    toObservable(trigger).pipe(
      switchMap(({ p }) =>
        fetch(p).pipe(
          map((value): Step<T> => ({ state: 'ok', value })),
          catchError((error: unknown) =>
            of<Step<T>>({ state: 'failed', message: apiErrorMessage(error) }),
          ),
          startWith<Step<T>>({ state: 'loading' }),
        ),
      ),
    ),
    { initialValue: { state: 'loading' } as Step<T> },
  );
  let last: T | null = null;
  const value = computed(() => {
    const step = steps();
    if (step.state === 'ok') last = step.value;
    if (step.state === 'failed') last = null;
    return last;
  });
  return {
    value,
    loading: computed(() => steps().state === 'loading'),
    error: computed(() => {
      const step = steps();
      return step.state === 'failed' ? step.message : '';
    }),
    reload: () => reloads.update((n) => n + 1),
  };
}
