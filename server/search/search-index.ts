import MiniSearch, { type SearchResult } from 'minisearch';
import { tokenize } from './vocabulary';

/** What the index knows of one procedure: its current approved revision. */
export interface IndexedProcedure {
  id: string;
  revisionId: string;
  revisionNumber: number;
  title: string;
  family: string;
  model: string;
  tags: string[];
  body: string;
  /** Reading labels and test points, one per line. */
  readings: string;
  /** Reckoner summaries ("fuse: recommended fuse 1.6 A time-delay (T)"), one per line. */
  reckoners: string;
}

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

// Few fields keep each query cheap: minisearch scores every matching document once per field.
const FIELDS = ['heading', 'meta', 'body', 'figures'] as const;
const BOOST = { heading: 4, meta: 2.5, figures: 1.5, body: 1 };
type Stored = { id: string; heading: string; meta: string; body: string; figures: string };
const toStored = (p: IndexedProcedure): Stored => ({
  id: p.id,
  heading: `${p.title} ${p.model}`,
  meta: `${p.family} ${p.tags.join(' ')}`,
  body: p.body,
  figures: `${p.readings}\n${p.reckoners}`,
});
const hasDigit = (t: string) => /\d/.test(t);

/**
 * The in-process full-text index (minisearch) with the trade vocabulary, prefix matching while
 * typing, and typo tolerance for words (never for numbers: 6.3 V must not find 6.8 V).
 */
export class SearchIndex {
  private docs = new Map<string, IndexedProcedure>();
  private mini = SearchIndex.create();

  private static create() {
    return new MiniSearch<Stored>({
      fields: [...FIELDS],
      storeFields: [],
      tokenize: (text) => tokenize(text),
      processTerm: (term) => term,
      searchOptions: {
        tokenize: (text) => tokenize(text),
        processTerm: (term) => term,
        boost: BOOST,
        prefix: (term) => term.length >= 3 && !hasDigit(term),
        fuzzy: (term) => (hasDigit(term) || term.length < 4 ? false : term.length >= 8 ? 0.25 : 0.2),
        combineWith: 'AND',
      },
    });
  }

  get size() {
    return this.docs.size;
  }

  replaceAll(procedures: IndexedProcedure[]) {
    const fresh = SearchIndex.create();
    fresh.addAll(procedures.map(toStored));
    this.mini = fresh;
    this.docs = new Map(procedures.map((p) => [p.id, p]));
  }

  upsert(p: IndexedProcedure) {
    if (this.docs.has(p.id)) this.mini.discard(p.id);
    this.mini.add(toStored(p));
    this.docs.set(p.id, p);
  }

  remove(id: string) {
    if (!this.docs.has(id)) return;
    this.mini.discard(id);
    this.docs.delete(id);
  }

  has(id: string) {
    return this.docs.has(id);
  }

  search(query: string, opts: { family?: string; tag?: string; page?: number; pageSize?: number } = {}): SearchPage {
    const page = Math.max(1, opts.page ?? 1);
    const pageSize = Math.min(50, Math.max(1, opts.pageSize ?? 20));
    const terms = tokenize(query);
    const empty: SearchPage = { query, total: 0, page, pageSize, results: [], suggestions: [], facets: { families: [], tags: [] } };
    if (!terms.length) return empty;

    // All words must match; when that finds nothing, any word may.
    let found = this.mini.search(query);
    if (!found.length && terms.length > 1) found = this.mini.search(query, { combineWith: 'OR' });
    const families = new Set<string>();
    const tags = new Set<string>();
    for (const r of found) {
      const d = this.docs.get(r.id as string);
      if (!d) continue;
      families.add(d.family);
      d.tags.forEach((t) => tags.add(t));
    }
    const filtered = found.filter((r) => {
      const d = this.docs.get(r.id as string);
      return !!d && (!opts.family || d.family === opts.family) && (!opts.tag || d.tags.includes(opts.tag));
    });
    const results = filtered.slice((page - 1) * pageSize, page * pageSize).map((r) => this.hit(r));
    const suggestions = filtered.length ? [] : this.suggest(query);
    return { query, total: filtered.length, page, pageSize, results, suggestions, facets: { families: [...families].sort(), tags: [...tags].sort() } };
  }

  private suggest(query: string): string[] {
    return this.mini
      .autoSuggest(query, { fuzzy: 0.3, prefix: true, combineWith: 'OR' })
      .slice(0, 5)
      .map((s) => s.suggestion);
  }

  private hit(r: SearchResult): SearchHit {
    const d = this.docs.get(r.id as string)!;
    return {
      procedureId: d.id,
      revisionId: d.revisionId,
      revisionNumber: d.revisionNumber,
      title: d.title,
      family: d.family,
      model: d.model,
      tags: d.tags,
      score: Math.round(r.score * 1000) / 1000,
      snippet: snippet([d.body, d.readings, d.reckoners].join('\n'), new Set(r.terms)),
    };
  }
}

/** The line that holds most matched terms, cut to ~200 characters, with those words marked. */
export function snippet(text: string, matched: Set<string>, max = 200): { text: string; hit: boolean }[] {
  const lines = text.split('\n').filter((l) => l.trim());
  const isHit = (word: string) => tokenize(word).some((t) => matched.has(t));
  let best = lines[0] ?? '';
  let bestCount = -1;
  for (const line of lines) {
    const count = tokenize(line).filter((t) => matched.has(t)).length;
    if (count > bestCount) {
      best = line;
      bestCount = count;
    }
  }
  if (best.length > max) best = best.slice(0, max).replace(/\s+\S*$/, '') + ' …';
  const parts: { text: string; hit: boolean }[] = [];
  for (const piece of best.split(/(\s+)/)) {
    const hit = piece.trim() !== '' && isHit(piece);
    const last = parts[parts.length - 1];
    if (last && last.hit === hit) last.text += piece;
    else parts.push({ text: piece, hit });
  }
  return parts;
}
