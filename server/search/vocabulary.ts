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

// A number, an optional SI prefix, an optional unit, with or without a space between.
const QUANTITY =
  /(\d+(?:[.,]\d+)?)\s*(meg|[pnuµμmk])?\s*(vac|vdc|volts?|v|amps?|a|watts?|w|hz|farad|f|ohms?|ω|va|henry|henries|h)?(?![a-z0-9])/g;

function normaliseQuantities(text: string) {
  return text.replace(
    QUANTITY,
    (whole, num: string, prefix: string | undefined, unit: string | undefined) => {
      if (!prefix && !unit) return whole;
      const n = num.replace(',', '.');
      const p = prefix ? PREFIXES[prefix] : '';
      // A bare "m" after a number without a unit is ambiguous; keep it as written.
      if (prefix && !unit && prefix !== 'k' && prefix !== 'meg') return ` ${n}${p} `;
      return ` ${n}${p}${unit ? UNIT_WORDS[unit] : ''} `;
    },
  );
}

/** Lower-cases, unifies synonyms and quantities. Idempotent. */
export function canonicalText(text: string): string {
  let t = ` ${text.toLowerCase().normalize('NFKC')} `;
  t = t.replace(/[\u2013\u2014]/g, '-');
  // Numbered rails: "B+2" / "HT2" is its own term as well as a B+ term.
  t = t.replace(/\b(?:b\s*\+|ht)\s*(\d)\b/g, ' bplus bplus$1 ');
  for (const [canonical, patterns] of SYNONYM_GROUPS) {
    for (const p of patterns) t = t.replace(p, ` ${canonical} `);
  }
  return normaliseQuantities(t);
}

/** Words too common in procedures to help a search. */
export const STOP_WORDS = new Set([
  'a',
  'an',
  'and',
  'at',
  'by',
  'for',
  'in',
  'is',
  'of',
  'on',
  'or',
  'the',
  'to',
  'with',
  'it',
  'be',
  'as',
  'from',
  'this',
  'that',
]);

/** Splits canonical text into terms: quantities like "6.3v" stay whole. */
export function tokenize(text: string): string[] {
  return canonicalText(text)
    .split(/[^\p{L}\p{N}.+]+/u)
    .map((t) => t.replace(/^[.+]+|[.+]+$/g, ''))
    .filter((t) => t.length > 0 && !STOP_WORDS.has(t));
}
