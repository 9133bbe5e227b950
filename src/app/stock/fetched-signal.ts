import { type Signal, computed } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { type Observable, catchError, map, of, startWith, switchMap } from 'rxjs';

/** What a fetch has given so far: the last value (kept while the next one loads) and the last error. */
export interface Fetched<T> {
  /** Whether a request is on its way. */
  readonly loading: boolean;
  readonly value: T | undefined;
  /** The failure of the latest request, or null. */
  readonly error: unknown;
}

/**
 * A signal that fetches `load(params())` again whenever the params change, dropping a request whose
 * params went stale (switchMap). The HTTP request stays at the RxJS edge; screens read signals.
 * Call in an injection context (a field initializer).
 */
export function fetchedSignal<P, T>(params: () => P, load: (params: P) => Observable<T>): Signal<Fetched<T>> {
  const source = computed(params);
  let last: T | undefined;
  return toSignal(
    toObservable(source).pipe(
      switchMap((current) =>
        load(current).pipe(
          map((value): Fetched<T> => {
            last = value;
            return { loading: false, value, error: null };
          }),
          catchError((error: unknown) => of<Fetched<T>>({ loading: false, value: last, error })),
          startWith<Fetched<T>>({ loading: true, value: last, error: null }),
        ),
      ),
    ),
    { initialValue: { loading: true, value: undefined, error: null } },
  );
}
