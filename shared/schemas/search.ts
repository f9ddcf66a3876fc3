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

export interface SearchPage {
  query: string;
  total: number;
  page: number;
  pageSize: number;
  results: SearchHit[];
  /** Spellings to try when nothing was found. */
  suggestions: string[];
  /** Equipment families and tags present among all matches, for filters. */
  facets: { families: string[]; tags: string[] };
}
