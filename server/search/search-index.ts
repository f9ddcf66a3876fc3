import SearchableMap from 'minisearch/SearchableMap';
import type { SearchHit, SearchPage } from '../../shared/schemas/search';
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

export type { SearchHit, SearchPage } from '../../shared/schemas/search';

/** Field weights: a word in the title counts four times one in the body. */
const FIELDS: { boost: number; text: (p: IndexedProcedure) => string }[] = [
  { boost: 4, text: (p) => `${p.title} ${p.model}` },
  { boost: 2.5, text: (p) => `${p.family} ${p.tags.join(' ')}` },
  { boost: 1.5, text: (p) => `${p.readings}\n${p.reckoners}` },
  { boost: 1, text: (p) => p.body },
];
// BM25 constants (Robertson & Zaragoza, "The Probabilistic Relevance Framework", 2009).
const K1 = 1.2;
const B = 0.7;
const PREFIX_FACTOR = 0.5;
const FUZZY_FACTOR = 0.35;

/** One term's documents: parallel arrays of document slots and their BM25 weights (without idf). */
interface Postings {
  slots: number[];
  weights: number[];
}
const hasDigit = (t: string) => /\d/.test(t);

/**
 * The in-process search index. minisearch's radix tree (SearchableMap) holds the vocabulary and
 * finds prefix and typo matches; each term keeps flat postings of per-document BM25 weights
 * (field-boosted, length-normalised). A query walks only its terms' postings into typed-array
 * accumulators and keeps just one page of hits, so broad queries over 10,000 procedures stay in
 * the low milliseconds (npm run bench:search).
 */
export class SearchIndex {
  private terms = new SearchableMap<Postings>();
  private docs: (IndexedProcedure | undefined)[] = [];
  private docTerms: (string[] | undefined)[] = [];
  private lineCache: ({ line: string; tokens: Set<string> }[] | undefined)[] = [];
  /** Tokens of each word a snippet shows, remembered: the library's words are few, snippets many. */
  private wordTokens = new Map<string, string[]>();
  private tokensOfWord = (word: string) => {
    let tokens = this.wordTokens.get(word);
    if (!tokens) {
      if (this.wordTokens.size >= 100_000) this.wordTokens.clear();
      this.wordTokens.set(word, (tokens = tokenize(word)));
    }
    return tokens;
  };
  private slotOf = new Map<string, number>();
  private fieldLengthSum = FIELDS.map(() => 0);
  // Families and tags as small integers per slot, so counting facets over thousands of matches is cheap.
  private facetNames: string[] = [];
  private facetIdOf = new Map<string, number>();
  private familyOf: number[] = [];
  private tagsOf: number[][] = [];
  // Query scratch space, one entry per document slot.
  private acc = new Float64Array(0);
  private hits = new Uint16Array(0);
  private best = new Float64Array(0);
  private stampOf = new Uint32Array(0);
  private stamp = 0;

  get size() {
    return this.slotOf.size;
  }

  has(id: string) {
    return this.slotOf.has(id);
  }

  replaceAll(procedures: IndexedProcedure[]) {
    this.terms = new SearchableMap<Postings>();
    this.docs = [];
    this.docTerms = [];
    this.lineCache = [];
    this.slotOf = new Map();
    this.facetNames = [];
    this.facetIdOf = new Map();
    this.familyOf = [];
    this.tagsOf = [];
    // Average field lengths first, so every document is normalised against the same figures.
    const tokenized = procedures.map((p) => FIELDS.map((f) => tokenize(f.text(p))));
    this.fieldLengthSum = FIELDS.map((_, i) => tokenized.reduce((sum, t) => sum + t[i]!.length, 0));
    procedures.forEach((p, i) => this.add(p, tokenized[i]!));
  }

  upsert(p: IndexedProcedure) {
    this.remove(p.id);
    const fields = FIELDS.map((f) => tokenize(f.text(p)));
    fields.forEach((t, i) => (this.fieldLengthSum[i]! += t.length));
    this.add(p, fields);
  }

  remove(id: string) {
    const slot = this.slotOf.get(id);
    if (slot === undefined) return;
    for (const term of this.docTerms[slot] ?? []) {
      const postings = this.terms.get(term);
      if (!postings) continue;
      const at = postings.slots.indexOf(slot);
      if (at >= 0) {
        postings.slots.splice(at, 1);
        postings.weights.splice(at, 1);
      }
      if (!postings.slots.length) this.terms.delete(term);
    }
    const p = this.docs[slot]!;
    FIELDS.forEach((f, i) => (this.fieldLengthSum[i]! -= tokenize(f.text(p)).length));
    this.docs[slot] = undefined;
    this.docTerms[slot] = undefined;
    this.lineCache[slot] = undefined;
    this.slotOf.delete(id);
  }

  private add(p: IndexedProcedure, fields: string[][]) {
    const slot = this.docs.length;
    const n = Math.max(1, this.slotOf.size + 1);
    const weights = new Map<string, number>();
    fields.forEach((tokens, i) => {
      const avg = Math.max(1, this.fieldLengthSum[i]! / n);
      const tf = new Map<string, number>();
      for (const t of tokens) tf.set(t, (tf.get(t) ?? 0) + 1);
      for (const [term, count] of tf) {
        const w = (FIELDS[i]!.boost * count * (K1 + 1)) / (count + K1 * (1 - B + (B * tokens.length) / avg));
        weights.set(term, (weights.get(term) ?? 0) + w);
      }
    });
    for (const [term, w] of weights) {
      let postings = this.terms.get(term);
      if (!postings) this.terms.set(term, (postings = { slots: [], weights: [] }));
      postings.slots.push(slot);
      postings.weights.push(w);
    }
    this.docs.push(p);
    this.docTerms.push([...weights.keys()]);
    this.familyOf.push(this.facetId(`f:${p.family}`));
    this.tagsOf.push(p.tags.map((t) => this.facetId(`t:${t}`)));
    this.slotOf.set(p.id, slot);
  }

  private facetId(name: string) {
    let id = this.facetIdOf.get(name);
    if (id === undefined) {
      id = this.facetNames.push(name) - 1;
      this.facetIdOf.set(name, id);
    }
    return id;
  }

  private idf(df: number) {
    const n = this.slotOf.size;
    return Math.log(1 + (n - df + 0.5) / (df + 0.5));
  }

  /** The postings one query term reaches: exact, prefix (while typing) and typo-tolerant. */
  private sourcesFor(term: string, isLast: boolean) {
    const sources: { postings: Postings; factor: number }[] = [];
    const words: string[] = [];
    const add = (word: string, postings: Postings, factor: number) => {
      words.push(word);
      sources.push({ postings, factor: factor * this.idf(postings.slots.length) });
    };
    const exact = this.terms.get(term);
    if (exact) add(term, exact, 1);
    if (isLast && term.length >= 3 && !hasDigit(term)) {
      for (const [word, postings] of this.terms.atPrefix(term))
        if (word !== term) add(word, postings, PREFIX_FACTOR);
    }
    if (!exact && term.length >= 4 && !hasDigit(term)) {
      const distance = term.length >= 8 ? 2 : 1;
      for (const [word, [postings, d]] of this.terms.fuzzyGet(term, distance))
        add(word, postings, FUZZY_FACTOR / d);
    }
    return { sources, words };
  }

  private ensureScratch() {
    const n = this.docs.length;
    if (this.acc.length >= n) return;
    const size = Math.max(1024, n * 2);
    this.acc = new Float64Array(size);
    this.hits = new Uint16Array(size);
    this.best = new Float64Array(size);
    this.stampOf = new Uint32Array(size);
    this.stamp = 0;
  }

  /**
   * Scores every document any query term reaches. Within a term the best-matching spelling counts;
   * across terms the scores add up. Returns the documents that matched all terms (or, when none
   * did, those that matched any, weighted by how many).
   */
  private score(terms: { sources: { postings: Postings; factor: number }[] }[]): {
    slots: number[];
    scores: number[];
  } {
    this.ensureScratch();
    const { acc, hits, best, stampOf } = this;
    const touched: number[] = [];
    for (const term of terms) {
      const stamp = ++this.stamp;
      const reached: number[] = [];
      for (const { postings, factor } of term.sources) {
        const { slots, weights } = postings;
        for (let j = 0; j < slots.length; j++) {
          const slot = slots[j]!;
          const s = weights[j]! * factor;
          if (stampOf[slot] !== stamp) {
            stampOf[slot] = stamp;
            best[slot] = s;
            reached.push(slot);
          } else if (s > best[slot]!) best[slot] = s;
        }
      }
      for (const slot of reached) {
        if (hits[slot] === 0) touched.push(slot);
        hits[slot]!++;
        acc[slot]! += best[slot]!;
      }
    }
    const out = { slots: [] as number[], scores: [] as number[] };
    for (const slot of touched) {
      if (hits[slot] === terms.length) {
        out.slots.push(slot);
        out.scores.push(acc[slot]!);
      }
    }
    if (!out.slots.length && terms.length > 1) {
      for (const slot of touched) {
        out.slots.push(slot);
        out.scores.push((acc[slot]! * hits[slot]!) / terms.length);
      }
    }
    for (const slot of touched) {
      acc[slot] = 0;
      hits[slot] = 0;
    }
    if (this.stamp > 4e9) {
      stampOf.fill(0);
      this.stamp = 0;
    }
    return out;
  }

  search(
    query: string,
    opts: { family?: string; tag?: string; page?: number; pageSize?: number } = {},
  ): SearchPage {
    const page = Math.max(1, opts.page ?? 1);
    const pageSize = Math.min(50, Math.max(1, opts.pageSize ?? 20));
    const queryTerms = [...new Set(tokenize(query))];
    const empty: SearchPage = {
      query,
      total: 0,
      page,
      pageSize,
      results: [],
      suggestions: [],
      facets: { families: [], tags: [] },
    };
    if (!queryTerms.length) return empty;

    const terms = queryTerms.map((t, i) => this.sourcesFor(t, i === queryTerms.length - 1));
    const words = new Set(terms.flatMap((m) => m.words));
    const found = this.score(terms);

    const seen = new Uint8Array(this.facetNames.length);
    const family = opts.family === undefined ? -1 : (this.facetIdOf.get(`f:${opts.family}`) ?? -2);
    const tag = opts.tag === undefined ? -1 : (this.facetIdOf.get(`t:${opts.tag}`) ?? -2);
    const kept: [number, number][] = [];
    for (let i = 0; i < found.slots.length; i++) {
      const slot = found.slots[i]!;
      const f = this.familyOf[slot]!;
      const ts = this.tagsOf[slot]!;
      seen[f] = 1;
      for (const t of ts) seen[t] = 1;
      if ((family === -1 || f === family) && (tag === -1 || ts.includes(tag)))
        kept.push([slot, found.scores[i]!]);
    }
    const families: string[] = [];
    const tags: string[] = [];
    seen.forEach((on, id) => {
      if (!on) return;
      const name = this.facetNames[id]!;
      (name.startsWith('f:') ? families : tags).push(name.slice(2));
    });
    const top = topK(kept, page * pageSize).slice((page - 1) * pageSize);
    return {
      query,
      total: kept.length,
      page,
      pageSize,
      results: top.map(([slot, score]) => this.hit(slot, score, words)),
      suggestions: kept.length ? [] : this.suggest(queryTerms),
      facets: { families: families.sort(), tags: tags.sort() },
    };
  }

  /** For each word, the closest spelling the library uses most. */
  private suggest(queryTerms: string[]): string[] {
    const fixed = queryTerms.map((t) => {
      if (this.terms.has(t) || hasDigit(t) || t.length < 3) return t;
      let best = t;
      let bestScore = -1;
      for (const [word, [postings, d]] of this.terms.fuzzyGet(t, t.length >= 7 ? 2 : 1)) {
        const s = postings.slots.length / d;
        if (s > bestScore) [best, bestScore] = [word, s];
      }
      return best;
    });
    const suggestion = fixed.join(' ');
    return suggestion !== queryTerms.join(' ') ? [suggestion] : [];
  }

  private hit(slot: number, score: number, words: Set<string>): SearchHit {
    const d = this.docs[slot]!;
    const lines = (this.lineCache[slot] ??= [d.body, d.readings, d.reckoners]
      .join('\n')
      .split('\n')
      .filter((l) => l.trim())
      .map((line) => ({ line, tokens: new Set(tokenize(line)) })));
    return {
      procedureId: d.id,
      revisionId: d.revisionId,
      revisionNumber: d.revisionNumber,
      title: d.title,
      family: d.family,
      model: d.model,
      tags: d.tags,
      score: Math.round(score * 1000) / 1000,
      snippet: snippetFrom(lines, words, 200, this.tokensOfWord),
    };
  }
}

/** The k best [slot, score] pairs, best first, without sorting everything. */
function topK(items: [number, number][], k: number): [number, number][] {
  if (items.length <= k * 4) return items.sort((a, b) => b[1] - a[1]).slice(0, k);
  const best: [number, number][] = [];
  for (const item of items) {
    if (best.length < k) {
      best.push(item);
      if (best.length === k) best.sort((a, b) => b[1] - a[1]);
    } else if (item[1] > best[k - 1]![1]) {
      let i = k - 1;
      while (i > 0 && best[i - 1]![1] < item[1]) i--;
      best.splice(i, 0, item);
      best.pop();
    }
  }
  return best.length < k ? best.sort((a, b) => b[1] - a[1]) : best;
}

/** The line that holds most matched terms, cut to ~200 characters, with those words marked. */
export function snippet(text: string, matched: Set<string>, max = 200) {
  const lines = text
    .split('\n')
    .filter((l) => l.trim())
    .map((line) => ({ line, tokens: new Set(tokenize(line)) }));
  return snippetFrom(lines, matched, max);
}

function snippetFrom(
  lines: { line: string; tokens: Set<string> }[],
  matched: Set<string>,
  max = 200,
  tokensOf = tokenize,
): { text: string; hit: boolean }[] {
  let best = lines[0]?.line ?? '';
  let bestCount = 0;
  for (const { line, tokens } of lines) {
    let count = 0;
    for (const t of matched) if (tokens.has(t)) count++;
    if (count > bestCount) {
      best = line;
      bestCount = count;
    }
  }
  if (best.length > max) best = best.slice(0, max).replace(/\s+\S*$/, '') + ' …';
  const parts: { text: string; hit: boolean }[] = [];
  for (const piece of best.split(/(\s+)/)) {
    const hit = piece.trim() !== '' && tokensOf(piece).some((t) => matched.has(t));
    const last = parts[parts.length - 1];
    if (last && last.hit === hit) last.text += piece;
    else parts.push({ text: piece, hit });
  }
  return parts;
}
