import { type Signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { type Observable, catchError, map, of, startWith, switchMap } from 'rxjs';

/** Where one HTTP exchange stands, as a value a template can read. */
export type RequestState<T> =
  | { status: 'idle' }
  | { status: 'loading' }
  | { status: 'done'; value: T }
  | { status: 'failed'; error: unknown };

/**
 * The answer to the latest `params` as a signal: each new value of `params` starts `load` and drops
 * the exchange still running for the one before (switchMap), so a slow old answer never overwrites a
 * new one; `undefined` params mean "nothing to ask". The bridge from RxJS at the edge to signals
 * inside; the subscription ends with the injection context that created it.
 * Must be called in an injection context.
 */
export function latestAnswer<P, T>(params: Signal<P | undefined>, load: (params: P) => Observable<T>): Signal<RequestState<T>> {
  const idle: RequestState<T> = { status: 'idle' };
  return toSignal(
    toObservable(params).pipe(
      switchMap((value) =>
        value === undefined
          ? of(idle)
          : load(value).pipe(
              map((answer): RequestState<T> => ({ status: 'done', value: answer })),
              startWith<RequestState<T>>({ status: 'loading' }),
              catchError((error: unknown) => of<RequestState<T>>({ status: 'failed', error })),
            ),
      ),
    ),
    { initialValue: idle },
  );
}

/** The value of a finished exchange, or undefined. */
export function answerOf<T>(state: RequestState<T>): T | undefined {
  return state.status === 'done' ? state.value : undefined;
}

/** The error of a failed exchange, or undefined. */
export function failureOf(state: RequestState<unknown>): unknown {
  return state.status === 'failed' ? state.error : undefined;
}
