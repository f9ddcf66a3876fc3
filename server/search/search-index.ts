import SearchableMap from 'minisearch/SearchableMap';
import { PARTIAL_LABEL, type SearchHit, type SearchPage } from '../../shared/schemas/search';
import { analyse, codeForm, tokenize } from './vocabulary';

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

export type { PartialHit, SearchHit, SearchPage } from '../../shared/schemas/search';

/** Field weights: a word in the title counts four times one in the body. */
const FIELDS: { boost: number; text: (p: IndexedProcedure) => string }[] = [
  { boost: 4, text: (p) => `${p.title} ${p.model}` },
  { boost: 2.5, text: (p) => `${p.family} ${p.tags.join(' ')}` },
  { boost: 1.5, text: (p) => `${p.readings}\n${p.reckoners}` },
  { boost: 1, text: (p) => p.body },
];
const NF = FIELDS.length;
const BOOST = FIELDS.map((f) => f.boost);
// BM25 constants (Robertson & Zaragoza, "The Probabilistic Relevance Framework", 2009).
const K1 = 1.2;
const B = 0.7;
const PREFIX_FACTOR = 0.5;
const UNIT_FACTOR = 0.9;
const FUZZY_FACTOR = 0.35;
/** Terms of a query beyond this many are ignored (a match mask per procedure holds 32). */
const MAX_QUERY_TERMS = 32;

/**
 * One term's documents: parallel arrays of document slots and term frequencies, one byte per field
 * packed in a number. BM25 weights are computed at query time from the whole library's field
 * lengths, so a procedure scores the same however and in whatever order the library was built.
 */
interface Postings {
  slots: number[];
  tf: number[];
  /** BM25 weights (without idf) as of `at`, the norms' version; recomputed when the library changed. */
  weights?: Float64Array;
  at?: number;
}
interface Source {
  postings: Postings;
  factor: number;
  /** Reached exactly, by synonym, unit or while typing — not only by a typo. */
  exact: boolean;
}
interface QueryTerm {
  term: string;
  /** As the person typed it, for "missing" labels and spelling help. */
  word: string;
  sources: Source[];
  /** Index terms reached, for marking the snippet. */
  words: string[];
}

const hasDigit = (t: string) => /\d/.test(t);
const hasLetter = (t: string) => /\p{L}/u.test(t);
const NUMBER = /^\d+(?:\.\d+)?$/;
const UNIT_SUFFIX = /^(?:[pnumk]|meg)?(?:v|a|w|hz|f|ohm|va|h|pf|nf|uf)$/;

/** Typo budget by the length of the word as typed: none up to four letters (a swap of two is allowed). */
const typoBudget = (word: string) => (word.length >= 8 ? 2 : word.length >= 5 ? 1 : 0);

/**
 * The in-process search index. minisearch's radix tree (SearchableMap) holds the vocabulary and
 * finds prefix and typo matches; each term keeps flat postings of per-field term frequencies. A
 * query walks only its terms' postings into typed-array accumulators and keeps just one page of
 * hits, so broad queries over 10,000 procedures stay in the low milliseconds (npm run bench:search).
 */
export class SearchIndex {
  private terms = new SearchableMap<Postings>();
  private docs: (IndexedProcedure | undefined)[] = [];
  private docTerms: (string[] | undefined)[] = [];
  private lineCache: ({ line: string; tokens: Set<string> }[] | undefined)[] = [];
  /** A written form of each term, for spelling suggestions (stems are not words). */
  private surface = new Map<string, string>();
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
  /** Field lengths per slot (slot * NF + field) and their sums over the library. */
  private fieldLength: number[] = [];
  private fieldLengthSum = FIELDS.map(() => 0);
  /** BM25 length normalisation per slot and field, recomputed after the library changes. */
  private norm = new Float64Array(0);
  private normStale = true;
  private normVersion = 0;
  /** Each slot's place in procedure-id order: equal scores rank by it, whatever the order of indexing. */
  private idRank = new Int32Array(0);
  // Families and tags as small integers per slot, so counting facets over thousands of matches is cheap.
  private facetNames: string[] = [];
  private facetIdOf = new Map<string, number>();
  private familyOf: number[] = [];
  private tagsOf: number[][] = [];
  // Query scratch space, one entry per document slot.
  private acc = new Float64Array(0);
  private mask = new Uint32Array(0);
  private exact = new Uint8Array(0);
  private best = new Float64Array(0);
  private bestExact = new Uint8Array(0);
  private stampOf = new Uint32Array(0);
  private reached = new Int32Array(0);
  private touched = new Int32Array(0);
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
    this.surface = new Map();
    this.slotOf = new Map();
    this.fieldLength = [];
    this.fieldLengthSum = FIELDS.map(() => 0);
    this.facetNames = [];
    this.facetIdOf = new Map();
    this.familyOf = [];
    this.tagsOf = [];
    for (const p of procedures) this.upsert(p);
  }

  upsert(p: IndexedProcedure) {
    this.remove(p.id);
    this.add(p);
  }

  remove(id: string) {
    const slot = this.slotOf.get(id);
    if (slot === undefined) return;
    for (const term of this.docTerms[slot] ?? []) {
      const postings = this.terms.get(term);
      if (!postings) continue;
      const at = sortedIndexOf(postings.slots, slot);
      if (at >= 0) {
        postings.slots.splice(at, 1);
        postings.tf.splice(at, 1);
      }
      if (!postings.slots.length) this.terms.delete(term);
    }
    for (let f = 0; f < NF; f++) {
      this.fieldLengthSum[f]! -= this.fieldLength[slot * NF + f]!;
      this.fieldLength[slot * NF + f] = 0;
    }
    this.docs[slot] = undefined;
    this.docTerms[slot] = undefined;
    this.lineCache[slot] = undefined;
    this.slotOf.delete(id);
    this.normStale = true;
  }

  private add(p: IndexedProcedure) {
    const slot = this.docs.length;
    const packed = new Map<string, number>();
    FIELDS.forEach((field, f) => {
      const tokens = analyse(field.text(p));
      this.fieldLength[slot * NF + f] = tokens.length;
      this.fieldLengthSum[f]! += tokens.length;
      for (const { term, word, part } of tokens) {
        const tf = packed.get(term) ?? 0;
        if (((tf >>> (8 * f)) & 255) < 255) packed.set(term, tf + 2 ** (8 * f));
        const known = this.surface.get(term);
        // The shortest, then alphabetically first, spelling: the same whatever the order of indexing.
        if (!part && (!known || word.length < known.length || (word.length === known.length && word < known)))
          this.surface.set(term, word);
      }
    });
    for (const [term, tf] of packed) {
      let postings = this.terms.get(term);
      if (!postings) this.terms.set(term, (postings = { slots: [], tf: [] }));
      postings.slots.push(slot);
      postings.tf.push(tf);
    }
    this.docs.push(p);
    this.docTerms.push([...packed.keys()]);
    this.familyOf.push(this.facetId(`f:${p.family}`));
    this.tagsOf.push(p.tags.map((t) => this.facetId(`t:${t}`)));
    this.slotOf.set(p.id, slot);
    this.normStale = true;
  }

  private facetId(name: string) {
    let id = this.facetIdOf.get(name);
    if (id === undefined) {
      id = this.facetNames.push(name) - 1;
      this.facetIdOf.set(name, id);
    }
    return id;
  }

  /** BM25's length normalisation against the library's current average field lengths. */
  private ensureNorms() {
    if (!this.normStale && this.norm.length >= this.docs.length * NF) return;
    const n = Math.max(1, this.slotOf.size);
    const avg = this.fieldLengthSum.map((sum) => Math.max(1, sum / n));
    if (this.norm.length < this.docs.length * NF) this.norm = new Float64Array(this.docs.length * NF * 2);
    for (let i = 0; i < this.docs.length * NF; i++)
      this.norm[i] = K1 * (1 - B + (B * this.fieldLength[i]!) / avg[i % NF]!);
    this.normStale = false;
    this.normVersion++;
    const live = [...this.slotOf.entries()].sort((a, b) => (a[0] < b[0] ? -1 : 1));
    this.idRank = new Int32Array(this.docs.length);
    live.forEach(([, slot], rank) => (this.idRank[slot] = rank));
  }

  /** A term's per-document BM25 weights against the current norms, cached until the library changes. */
  private weightsOf(p: Postings): Float64Array {
    if (p.weights && p.at === this.normVersion) return p.weights;
    const { slots, tf } = p;
    const weights = (p.weights = new Float64Array(slots.length));
    for (let j = 0; j < slots.length; j++) {
      let w = 0;
      for (
        let f = 0, packed = tf[j]!, base = slots[j]! * NF;
        f < NF;
        f++, packed = Math.floor(packed / 256)
      ) {
        const c = packed % 256;
        if (c) w += (BOOST[f]! * c * (K1 + 1)) / (c + this.norm[base + f]!);
      }
      weights[j] = w;
    }
    p.at = this.normVersion;
    return weights;
  }

  private idf(df: number) {
    const n = this.slotOf.size;
    return Math.log(1 + (n - df + 0.5) / (df + 0.5));
  }

  /**
   * Query terms from the query text. Pieces of a code typed apart ("tc 18", "EL 34", "5 AR 4") are
   * joined when the library knows the joined code; stop words are gone; code pieces are not queried.
   */
  private queryTerms(query: string): { term: string; word: string }[] {
    const raw = query.split(/\s+/).filter(Boolean);
    const joined: string[] = [];
    for (let i = 0; i < raw.length; i++) {
      let n = 0;
      for (const size of [3, 2]) {
        const code = codeForm(raw.slice(i, i + size).join(''));
        if (
          i + size <= raw.length &&
          code.length <= 12 &&
          hasLetter(code) &&
          hasDigit(code) &&
          this.terms.has(code)
        ) {
          n = size;
          joined.push(code);
          break;
        }
      }
      if (n) i += n - 1;
      else joined.push(raw[i]!);
    }
    const seen = new Set<string>();
    const out: { term: string; word: string }[] = [];
    for (const t of analyse(joined.join(' '))) {
      if (t.part || seen.has(t.term)) continue;
      seen.add(t.term);
      out.push({ term: t.term, word: t.word });
    }
    return out.slice(0, MAX_QUERY_TERMS);
  }

  /** The postings one query term reaches: exact, a number's quantities, prefix (while typing), typos. */
  private resolve(q: { term: string; word: string }, isLast: boolean): QueryTerm {
    const { term } = q;
    const out: QueryTerm = { ...q, sources: [], words: [] };
    const add = (word: string, postings: Postings, factor: number, exact: boolean) => {
      out.words.push(word);
      out.sources.push({ postings, factor: factor * this.idf(postings.slots.length), exact });
    };
    const exact = this.terms.get(term);
    if (exact) add(term, exact, 1, true);
    if (NUMBER.test(term)) {
      // "6.3" meets "6.3v", "100" meets "100uf" (not "1000v").
      for (const [word, postings] of this.terms.atPrefix(term))
        if (UNIT_SUFFIX.test(word.slice(term.length))) add(word, postings, UNIT_FACTOR, true);
    } else if (isLast && term.length >= 3) {
      // While typing: "blee" → "bleeder"; a code only gains letters ("tc-30" → "tc30h", not "tc300").
      const code = hasDigit(term);
      for (const [word, postings] of this.terms.atPrefix(term))
        if (word !== term && (!code || !hasDigit(word.slice(term.length))))
          add(word, postings, PREFIX_FACTOR, true);
    }
    if (!exact && !hasDigit(term))
      for (const [word, postings, d] of this.typos(q)) add(word, postings, FUZZY_FACTOR / d, false);
    return out;
  }

  /**
   * Library words within the typo budget of the word as typed, keeping its first letter (people
   * rarely mistype that, and "cable" is not "table"), plus any swap of two neighbouring letters.
   */
  private typos(q: { term: string; word: string }): [string, Postings, number][] {
    const { term } = q;
    const found = new Map<string, [string, Postings, number]>();
    const budget = typoBudget(q.word);
    if (budget) {
      // Only words with the same first letter: search that branch of the vocabulary tree.
      const first = term[0]!;
      for (const [rest, [postings, d]] of this.terms.atPrefix(first).fuzzyGet(term.slice(1), budget))
        if (d > 0 && !hasDigit(rest)) found.set(first + rest, [first + rest, postings, d]);
    }
    for (let i = 0; i + 1 < term.length; i++) {
      const swapped = term.slice(0, i) + term[i + 1] + term[i] + term.slice(i + 2);
      const postings = swapped !== term ? this.terms.get(swapped) : undefined;
      if (postings) found.set(swapped, [swapped, postings, 1]);
    }
    return [...found.values()];
  }

  private ensureScratch() {
    const n = this.docs.length;
    if (this.acc.length >= n) return;
    const size = Math.max(1024, n * 2);
    this.acc = new Float64Array(size);
    this.mask = new Uint32Array(size);
    this.exact = new Uint8Array(size);
    this.best = new Float64Array(size);
    this.bestExact = new Uint8Array(size);
    this.stampOf = new Uint32Array(size);
    this.reached = new Int32Array(size);
    this.touched = new Int32Array(size);
    this.stamp = 0;
  }

  /**
   * Scores every document any query term reaches. Within a term the best-matching spelling counts;
   * across terms the scores add up. Returns how many slots it reached (listed in `touched`); their scores, masks of the terms
   * matched and whether any term matched exactly (or by synonym, unit or prefix) stay in the scratch
   * arrays until clearScratch.
   */
  private score(terms: QueryTerm[]): number {
    this.ensureScratch();
    this.ensureNorms();
    const { acc, mask, exact, best, bestExact, stampOf, reached, touched } = this;
    let nTouched = 0;
    for (let bit = 0; bit < terms.length; bit++) {
      const stamp = ++this.stamp;
      let nReached = 0;
      for (const source of terms[bit]!.sources) {
        const { slots } = source.postings;
        const weights = this.weightsOf(source.postings);
        const { factor } = source;
        const isExact = source.exact ? 1 : 0;
        for (let j = 0; j < slots.length; j++) {
          const slot = slots[j]!;
          const s = weights[j]! * factor;
          if (stampOf[slot] !== stamp) {
            stampOf[slot] = stamp;
            best[slot] = s;
            bestExact[slot] = isExact;
            reached[nReached++] = slot;
          } else {
            if (s > best[slot]!) best[slot] = s;
            bestExact[slot]! |= isExact;
          }
        }
      }
      const bitValue = 2 ** bit;
      for (let r = 0; r < nReached; r++) {
        const slot = reached[r]!;
        if (mask[slot] === 0) touched[nTouched++] = slot;
        mask[slot]! += bitValue;
        acc[slot]! += best[slot]!;
        exact[slot]! |= bestExact[slot]!;
      }
    }
    if (this.stamp > 4e9) {
      stampOf.fill(0);
      this.stamp = 0;
    }
    return nTouched;
  }

  private clearScratch(nTouched: number) {
    for (let i = 0; i < nTouched; i++) {
      const slot = this.touched[i]!;
      this.acc[slot] = 0;
      this.mask[slot] = 0;
      this.exact[slot] = 0;
    }
  }

  search(
    query: string,
    opts: { family?: string; tag?: string; page?: number; pageSize?: number } = {},
  ): SearchPage {
    const page = Math.max(1, opts.page ?? 1);
    const pageSize = Math.min(50, Math.max(1, opts.pageSize ?? 20));
    const out: SearchPage = {
      query,
      total: 0,
      page,
      pageSize,
      results: [],
      partial: null,
      correctedQuery: null,
      suggestions: [],
      facets: { families: [], tags: [] },
    };
    const asked = this.queryTerms(query);
    if (!asked.length) return out;

    let terms = asked.map((t, i) => this.resolve(t, i === asked.length - 1));
    // No word of the query is in the library, but each is a typo of one that is: search that instead.
    const corrections = terms.every((t) => !t.sources.some((s) => s.exact))
      ? terms.map((t) => this.closest(t))
      : [];
    if (corrections.length && corrections.every(Boolean)) {
      terms = corrections.map((c) => this.resolve({ term: c!, word: this.surface.get(c!) ?? c! }, false));
      out.correctedQuery = terms.map((t) => t.word).join(' ');
    }
    // The scratch arrays hold each touched procedure's score, matched-term mask and exact flag.
    const nTouched = this.score(terms);
    const { acc, mask, exact, idRank, touched } = this;
    const all = 2 ** terms.length - 1;
    let anyFull = false;
    for (let i = 0; i < nTouched && !anyFull; i++)
      anyFull = exact[touched[i]!] === 1 && mask[touched[i]!] === all;
    // Partial matches rank by how many words they match, then by score.
    const key = anyFull
      ? (slot: number) => acc[slot]!
      : (slot: number) => popcount(mask[slot]!) * 1e4 + acc[slot]!;
    // Best first; equal scores by procedure id, so the order never depends on the order of indexing.
    const before = (a: number, b: number) => {
      const d = key(a) - key(b);
      return d ? d > 0 : idRank[a]! < idRank[b]!;
    };

    const seen = new Uint8Array(this.facetNames.length);
    const family = opts.family === undefined ? -1 : (this.facetIdOf.get(`f:${opts.family}`) ?? -2);
    const tag = opts.tag === undefined ? -1 : (this.facetIdOf.get(`t:${opts.tag}`) ?? -2);
    const k = page * pageSize;
    const best: number[] = []; // slots, best first, at most k
    let kept = 0;
    for (let i = 0; i < nTouched; i++) {
      const slot = touched[i]!;
      if (!exact[slot] || (mask[slot] === all) !== anyFull) continue;
      const f = this.familyOf[slot]!;
      const ts = this.tagsOf[slot]!;
      seen[f] = 1;
      for (const t of ts) seen[t] = 1;
      if ((family !== -1 && f !== family) || (tag !== -1 && !ts.includes(tag))) continue;
      kept++;
      if (best.length === k && !before(slot, best[k - 1]!)) continue;
      let at = best.length < k ? best.length : k - 1;
      while (at > 0 && before(slot, best[at - 1]!)) at--;
      best.splice(at, 0, slot);
      if (best.length > k) best.pop();
    }
    const top = best
      .slice((page - 1) * pageSize)
      .map((slot) => ({ slot, score: acc[slot]!, mask: mask[slot]! }));
    this.clearScratch(nTouched);
    seen.forEach((on, id) => {
      if (!on) return;
      const name = this.facetNames[id]!;
      (name.startsWith('f:') ? out.facets.families : out.facets.tags).push(name.slice(2));
    });
    out.facets.families.sort();
    out.facets.tags.sort();
    const words = new Set(terms.flatMap((t) => t.words));
    if (anyFull) {
      out.total = kept;
      out.results = top.map((r) => this.hit(r.slot, r.score, words));
    } else {
      out.suggestions = this.suggest(terms);
      if (kept)
        out.partial = {
          label: PARTIAL_LABEL,
          total: kept,
          results: top.map((r) => ({
            ...this.hit(r.slot, r.score, words),
            missing: terms.filter((_, bit) => !(r.mask & (2 ** bit))).map((t) => t.word),
          })),
        };
    }
    return out;
  }

  /** The library's likeliest spelling of a word it does not have: most procedures, fewest edits. */
  private closest(t: { term: string; word: string }): string | undefined {
    if (hasDigit(t.term)) return undefined;
    let best: string | undefined;
    let bestScore = -1;
    for (const [word, postings, d] of this.typos(t)) {
      const s = postings.slots.length / d;
      if (s > bestScore || (s === bestScore && word < best!)) [best, bestScore] = [word, s];
    }
    return best;
  }

  /** The query with each word the library lacks replaced by its closest spelling, when that differs. */
  private suggest(terms: QueryTerm[]): string[] {
    const fixed = terms.map((t) => {
      if (t.sources.some((s) => s.exact)) return t.word;
      const c = this.closest(t);
      return c ? (this.surface.get(c) ?? c) : t.word;
    });
    const suggestion = fixed.join(' ');
    return suggestion !== terms.map((t) => t.word).join(' ') ? [suggestion] : [];
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

/** Slots are appended in increasing order, so each postings list is sorted. */
function sortedIndexOf(xs: number[], x: number) {
  let lo = 0;
  let hi = xs.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    if (xs[mid]! < x) lo = mid + 1;
    else if (xs[mid]! > x) hi = mid - 1;
    else return mid;
  }
  return -1;
}

function popcount(m: number) {
  let n = 0;
  for (let x = m >>> 0; x; x &= x - 1) n++;
  return n;
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
