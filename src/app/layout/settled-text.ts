import { type Signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { debounceTime, distinctUntilChanged } from 'rxjs';

/** Pause in typing before a search box's text is sent, ms. */
export const SEARCH_PAUSE_MS = 250;

/**
 * `text` once typing has paused for `pauseMs` (starting from its value now), so a search box asks
 * the server once per pause, not once per key. Must be called in an injection context.
 */
export function settledText(text: Signal<string>, pauseMs = SEARCH_PAUSE_MS): Signal<string> {
  return toSignal(toObservable(text).pipe(debounceTime(pauseMs), distinctUntilChanged()), { initialValue: text() });
}
