/** What GET /api/search answers; the server builds it, the client renders it. */

export interface SearchHit {
  procedureId: string;
  revisionId: string;
  revisionNumber: number;
  title: string;
  family: string;
  model: string;
  tags: string[];
  score: number;
  /** A short extract with the matched words marked; rendered as text, never as HTML. */
  snippet: { text: string; hit: boolean }[];
}

/** A procedure that matches only some of the query's words, with the words it lacks. */
export interface PartialHit extends SearchHit {
  missing: string[];
}

/** The heading of the partial group, one wording for the API and the page. */
export const PARTIAL_LABEL = 'Matches some of your words';

export interface SearchPage {
  query: string;
  /** Procedures that match every word of the query (after synonyms, units, codes and typos). */
  total: number;
  page: number;
  pageSize: number;
  results: SearchHit[];
  /**
   * Only when nothing matches every word: procedures that match some of them, a separate group
   * that is never mixed into `results`. Paged like them.
   */
  partial: { label: string; total: number; results: PartialHit[] } | null;
  /** When no word of the query is in the library but each is one typo away: the query searched instead. */
  correctedQuery: string | null;
  /** Spellings to try when nothing was found. */
  suggestions: string[];
  /** Equipment families and tags present among all matches of the group shown, for filters. */
  facets: { families: string[]; tags: string[] };
}
