import { type Signal, computed, signal, type WritableSignal } from '@angular/core';

import { SEARCH_PAUSE_MS, settledText } from '../layout/settled-text.js';
import type { MatchClient } from './match-client.js';
import { type RequestState, answerOf, latestAnswer } from './request-state.js';
import type { SavedMatchSummary } from './saved-match.js';

/** A "find saved matches by name" box and what the server answers for it. */
export interface SavedMatchSearch {
  /** What the box holds, as typed. */
  readonly text: WritableSignal<string>;
  /** The latest answer for the text after a pause in typing. */
  readonly answer: Signal<RequestState<{ items: SavedMatchSummary[]; total: number }>>;
  /** The newest matches found (empty while they are fetched). */
  readonly items: Signal<SavedMatchSummary[]>;
  /** How many saved matches the search finds in all; the list holds the newest page of them. */
  readonly total: Signal<number>;
  /** Whether the search sent holds any text. */
  readonly active: Signal<boolean>;
}

/**
 * Searches the saved matches by name as the user types (`GET /api/matches?search=`), waiting
 * {@link SEARCH_PAUSE_MS} after the last key; each change of `reload` asks again. A newer search
 * drops the one still running. Must be called in an injection context.
 */
export function searchSavedMatches(client: MatchClient, reload: Signal<unknown> = signal(0)): SavedMatchSearch {
  const text = signal('');
  const settled = settledText(text);
  const answer = latestAnswer(
    computed(() => ({ reload: reload(), search: settled() })),
    ({ search }) => client.find(search),
  );
  return {
    text,
    answer,
    items: computed(() => answerOf(answer())?.items ?? []),
    total: computed(() => answerOf(answer())?.total ?? 0),
    active: computed(() => settled().trim() !== ''),
  };
}
