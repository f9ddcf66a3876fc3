/**
 * The trade's own words. Text is put into one canonical spelling before it is split into terms,
 * for the index and for queries alike, so "HT", "B+" and "plate supply" all become one term and
 * "47uF", "47 µF" and "47 μF" become another.
 */

/** Each group: the canonical term first, then the patterns that mean the same. */
const SYNONYM_GROUPS: readonly [string, readonly RegExp[]][] = [
  [
    'bplus',
    [
      /\bb\s*\+/g,
      /\bht\b/g,
      /\bh\.t\./g,
      /\bplate\s+(?:supply|voltage|rail)s?\b/g,
      /\banode\s+supply\b/g,
      /\bhigh\s+tension\b/g,
      /\bb-plus\b/g,
    ],
  ],
  ['heater', [/\bfilaments?\b/g, /\bheaters?\b/g]],
  [
    'timedelay',
    [/\bslow[\s-]?blow\b/g, /\btime[\s-]?(?:delay|lag)\b/g, /\bt[\s-]type\b/g, /\bsurge[\s-]proof\b/g],
  ],
  ['timedelay fuse', [/\bt[\s-]fuses?\b/g]],
  ['quickacting', [/\bquick[\s-]?(?:acting|blow)\b/g, /\bfast[\s-]?(?:acting|blow)\b/g]],
  ['quickacting fuse', [/\bf[\s-]fuses?\b/g]],
  ['capacitor', [/\bcaps?\b/g, /\bcapacitors?\b/g, /\bcondensers?\b/g, /\be-?caps?\b/g]],
  ['transformer', [/\bxfmrs?\b/g, /\btransformers?\b/g, /\btrafos?\b/g, /\bxformers?\b/g]],
  ['rectifier', [/\brectifiers?\b/g, /\brect\b/g]],
  ['resistor', [/\bresistors?\b/g, /\bres\b/g]],
  ['valve', [/\bvalves?\b/g, /\btubes?\b/g]],
  ['mains', [/\bmains\b/g, /\bline\s+voltage\b/g, /\bac\s+line\b/g]],
];

const UNIT_WORDS: Record<string, string> = {
  v: 'v',
  vac: 'v',
  vdc: 'v',
  volt: 'v',
  volts: 'v',
  a: 'a',
  amp: 'a',
  amps: 'a',
  w: 'w',
  watt: 'w',
  watts: 'w',
  hz: 'hz',
  f: 'f',
  farad: 'f',
  ohm: 'ohm',
  ohms: 'ohm',
  ω: 'ohm',
  r: 'ohm',
  va: 'va',
  h: 'h',
  henry: 'h',
  henries: 'h',
};
const PREFIXES: Record<string, string> = {
  p: 'p',
  n: 'n',
  u: 'u',
  µ: 'u',
  μ: 'u',
  m: 'm',
  k: 'k',
  meg: 'meg',
};

// A number, an optional SI prefix, an optional unit, with or without a space between; not inside
// a code ("TC-5R", "TC-30H" are models, not 5 Ω and 30 H).
const NOT_IN_CODE = String.raw`(?<![\p{L}\p{N}.]|[\p{L}\p{N}][-.])`;
const END = String.raw`(?![\p{L}\p{N}]|[-.][\p{L}\p{N}])`;
const QUANTITY = new RegExp(
  NOT_IN_CODE +
    String.raw`(\d+(?:[.,]\d+)?)\s*(meg|[pnuµμmk])?\s*(vac|vdc|volts?|v|amps?|a|watts?|w|hz|farad|f|ohms?|ω|va|henry|henries|h)?` +
    END,
  'gu',
);
// IEC 60062 RKM code: "2k2" = 2.2 kΩ, "4R7" = 4.7 Ω, "1M5" = 1.5 MΩ, "4n7" = 4.7 nF, "2u2" = 2.2 µF.
const RKM = new RegExp(NOT_IN_CODE + String.raw`(\d{1,3})([RrKkMpnuµμ])(\d{1,2})` + END, 'gu');
const RKM_UNIT: Record<string, string> = {
  r: 'ohm',
  k: 'kohm',
  M: 'megohm',
  p: 'pf',
  n: 'nf',
  u: 'uf',
  µ: 'uf',
  μ: 'uf',
};

function normaliseQuantities(text: string) {
  return text.replace(
    QUANTITY,
    (whole, num: string, prefix: string | undefined, unit: string | undefined) => {
      if (!prefix && !unit) return whole;
      const n = num.replace(',', '.');
      const p = prefix ? PREFIXES[prefix] : '';
      // A bare k or meg after a number is resistance, a bare p/n/u capacitance; a bare m stays as written.
      if (prefix && !unit) return ` ${n}${p}${p === 'k' || p === 'meg' ? 'ohm' : p === 'm' ? '' : 'f'} `;
      return ` ${n}${p}${unit ? UNIT_WORDS[unit] : ''} `;
    },
  );
}

/** Lower-cases, unifies synonyms and quantities. Idempotent. */
export function canonicalText(text: string): string {
  let t = ` ${text.normalize('NFKC')} `;
  t = t.replace(
    RKM,
    (_, a: string, letter: string, b: string) =>
      ` ${a}.${b}${RKM_UNIT[letter] ?? RKM_UNIT[letter.toLowerCase()]} `,
  );
  t = t.toLowerCase().replace(/[\u2010-\u2015\u2212]/g, '-');
  // "doesn't" → "doesnt", "shop's" → "shops": one word, so filler stays a stop word.
  t = t.replace(/(\p{L})['\u2019](\p{L})/gu, '$1$2');
  // Numbered rails: "B+2" / "HT2" is its own term as well as a B+ term.
  t = t.replace(/\b(?:b\s*\+|ht)\s*(\d)\b/g, ' bplus bplus$1 ');
  for (const [canonical, patterns] of SYNONYM_GROUPS) {
    for (const p of patterns) t = t.replace(p, ` ${canonical} `);
  }
  return normaliseQuantities(t);
}

/** Words that carry no meaning in a search: common words and the filler of plain questions. */
export const STOP_WORDS = new Set(
  `a about above across after again all also an and any are as at be below between been being but by can could did didnt do does
  doesnt doing done dont for from get gets getting got had has have having he her here his how hows i if
  im in into is isnt near need needs it its ive just me my myself of on or our ours please procedure procedures s she
  over should so some such than that thats the their them then there these they this those through to too under us
  very want wants was we were what whats when where which while who why will with within would you your`.split(
    /\s+/,
  ),
);

/** Letters and digits of a code, joined: "TC-18", "tc 18", "tc.18" and "TC18" all become "tc18". */
export const codeForm = (s: string) => s.toLowerCase().replace(/[^\p{L}\p{N}]+/gu, '');

const hasLetter = (s: string) => /\p{L}/u.test(s);
const hasDigit = (s: string) => /\p{N}/u.test(s);
const VOWEL = /[aeiouy]/;
const CONSONANT = /[^aeiouy]/;

/**
 * A light English stemmer (plural, -ed, -ing; after Harman 1991 and Porter 1980 step 1): index and
 * queries share it, so "fuses", "fused" and "fusing" meet "fuse", and "restuffing" meets "restuff".
 * Stems are terms, never shown.
 */
export function stem(word: string): string {
  let w = word;
  if (w.length < 4 || !/^\p{L}+$/u.test(w)) return w;
  if (w.endsWith('ies') && w.length > 4) w = w.slice(0, -3) + 'y';
  else if (/(?:ss|x|ch|sh)es$/.test(w)) w = w.slice(0, -2);
  else if (w.endsWith('s') && !/[aisu]s$/.test(w)) w = w.slice(0, -1);
  let cut = '';
  if (w.endsWith('ied') && w.length > 4) w = w.slice(0, -3) + 'y';
  else if (w.endsWith('ing') && w.length >= 6 && VOWEL.test(w.slice(0, -3))) cut = w = w.slice(0, -3);
  else if (w.endsWith('ed') && !w.endsWith('eed') && w.length >= 5 && VOWEL.test(w.slice(0, -2)))
    cut = w = w.slice(0, -2);
  // "fus(ed)" → "fuse", "rat(ed)" → "rate": a short consonant-vowel-consonant stem had a silent e.
  if (cut && w.length === 3 && CONSONANT.test(w[0]!) && VOWEL.test(w[1]!) && /[^aeiouwxy]/.test(w[2]!))
    w += 'e';
  if (w.length >= 5 && w.endsWith('e')) w = w.slice(0, -1);
  if (/([^aeiouylsz])\1$/.test(w)) w = w.slice(0, -1);
  return w;
}

/** One term of a text: `part` marks a piece of a code ("tc" of "TC-18"), indexed but never queried. */
export interface Token {
  term: string;
  /** The word as written (lower case), for labels and spelling help. */
  word: string;
  part?: boolean;
}

const WORD = /[\p{L}\p{N}]+(?:[.-][\p{L}\p{N}]+)*/gu;
const NUMBER = /^\d+(?:\.\d+)?$/;
const QUANTITY_TERM = /^\d+(?:\.\d+)?(?:[pnumk]|meg)?(?:v|a|w|hz|f|ohm|va|h|pf|nf|uf)?$/;
const LETTERS_THEN_DIGITS = /^(\p{L}+)(\d.*)$/u;

// The library's words are few and repeat: each is stemmed once.
const stems = new Map<string, string>();
function plainWord(w: string, out: Token[]) {
  if (STOP_WORDS.has(w)) return;
  let term = stems.get(w);
  if (term === undefined) {
    if (stems.size >= 200_000) stems.clear();
    stems.set(w, (term = stem(w)));
  }
  out.push({ term, word: w });
}
const LETTERS = /^\p{L}+$/u;

/**
 * Splits text into terms. A code (letters and digits: "TC-30H", "5AR4", "1N4007", "EL 34" once
 * joined) becomes one term in its normal form, beside its pieces; quantities stay whole ("6.3v").
 */
export function analyse(text: string): Token[] {
  const out: Token[] = [];
  for (const [w] of canonicalText(text).matchAll(WORD)) {
    if (LETTERS.test(w)) {
      plainWord(w, out);
      continue;
    }
    if (NUMBER.test(w) || QUANTITY_TERM.test(w)) {
      out.push({ term: w, word: w });
      continue;
    }
    const pieces = w.split(/[.-]/);
    const whole = pieces.join('');
    if (hasLetter(whole) && hasDigit(whole) && whole.length <= 12) {
      out.push({ term: whole, word: w });
      const split = pieces.length > 1 ? pieces : LETTERS_THEN_DIGITS.exec(whole)?.slice(1);
      for (const piece of split ?? [])
        if (!STOP_WORDS.has(piece)) out.push({ term: piece, word: piece, part: true });
    } else for (const piece of pieces) plainWord(piece, out);
  }
  return out;
}

/** Every term of a text, code pieces included: what the index stores. */
export function tokenize(text: string): string[] {
  return analyse(text).map((t) => t.term);
}
