/**
 * Validation problems in people's words. A field is named as its form labels it: the `title` in the
 * field's zod metadata (`.meta({ title: 'Model' })`, zod's global registry), which the forms read
 * through `labelOf`, so the label beside a field and the label in a refusal cannot drift apart.
 * zod's own messages ("Invalid input: expected string, received undefined") never reach people:
 * each issue code becomes a sentence. A message a schema states itself is kept when it is a whole
 * sentence (starts with a capital letter); a custom rule's message is a predicate ("must be on one
 * line") put after the label.
 */
import { z } from 'zod';

export interface Problem {
  /** Where the problem is, for machines: "body.model", "params.id", "windings.0.volts". */
  field: string;
  /** The field as the form labels it: "Model", "Winding 1 voltage". */
  label: string;
  /** The problem as one sentence naming the field: "Model is required". */
  reason: string;
}

type Node = z.core.$ZodType;
type Def = Node['_zod']['def'] & Record<string, unknown>;
const defOf = (s: Node) => s._zod.def as Def;

const WRAPPERS = new Set(['optional', 'nullable', 'default', 'prefault', 'catch', 'readonly', 'nonoptional']);

/** "equipmentFamily" → "Equipment family": the fallback for a field without a title. */
export function humanize(key: string): string {
  const words = key
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/[_-]+/g, ' ')
    .trim()
    .toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}

const lowerFirst = (s: string) => (/^[A-Z][a-z]/.test(s) ? s.charAt(0).toLowerCase() + s.slice(1) : s);

/** The schema itself and what it wraps (optional, default, the input side of a transform, …). */
function* layers(schema: Node | undefined): Generator<Node> {
  const seen = new Set<Node>();
  let s = schema;
  while (s && !seen.has(s)) {
    seen.add(s);
    yield s;
    const def = defOf(s);
    if (WRAPPERS.has(def.type)) s = def.innerType as Node;
    else if (def.type === 'pipe') s = def.in as Node;
    else if (def.type === 'lazy') s = (def.getter as () => Node)();
    else s = undefined;
  }
}

function titleOf(schema: Node | undefined): string | undefined {
  for (const s of layers(schema)) {
    const title = z.globalRegistry.get(s)?.title;
    if (title) return title;
  }
  // A form's own input piped into the server's field (tags typed as one line): the field's title.
  for (const s of layers(schema)) {
    const def = defOf(s);
    const title = def.type === 'pipe' ? titleOf(def.out as Node) : undefined;
    if (title) return title;
  }
  return undefined;
}

/** The schema of one step down: an object's property, an array's element, a union member that has it. */
function childOf(schema: Node | undefined, key: PropertyKey): Node | undefined {
  for (const s of layers(schema)) {
    const def = defOf(s);
    if (def.type === 'object') {
      const shape = def.shape as Record<string, Node>;
      if (typeof key === 'string' && key in shape) return shape[key];
      return (def.catchall as Node | undefined) ?? undefined;
    }
    if (def.type === 'array' && typeof key === 'number') return def.element as Node;
    if (def.type === 'record') return def.valueType as Node;
    if (def.type === 'union')
      for (const option of def.options as Node[]) {
        const child = childOf(option, key);
        if (child) return child;
      }
    if (def.type === 'pipe') {
      const out = childOf(def.out as Node, key);
      if (out) return out;
    }
  }
  return undefined;
}

/**
 * A row's field named as a person would: "Winding 1 voltage" for row noun "Winding", row 1 and
 * field label "Winding voltage"; "Valve 2 heater current" where the label does not repeat the noun.
 */
export function rowFieldLabel(noun: string, row: number, label: string): string {
  const lead = new RegExp(`^${noun.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\b`, 'i');
  if (lead.test(label)) return `${noun} ${row}${label.slice(noun.length)}`;
  return `${noun} ${row} ${lowerFirst(label)}`;
}

/**
 * The field at `path` named as the form labels it. Nested objects take the innermost title (a form
 * shows the leaf field); list entries are numbered from 1 ("Tag 3"), a row's fields by their row
 * ("Winding 1 voltage").
 */
export function labelAt(schema: Node | undefined, path: readonly PropertyKey[]): string {
  let node = schema;
  let label = titleOf(schema) ?? '';
  let row: { noun: string; n: number } | null = null;
  for (const seg of path) {
    node = childOf(node, seg);
    const title = titleOf(node);
    if (typeof seg === 'number' || /^\d+$/.test(String(seg))) {
      const n = Number(seg) + 1;
      const noun = title ?? label;
      row = { noun: noun || 'Entry', n };
      label = noun ? `${noun} ${n}` : `Entry ${n}`;
    } else {
      const own = title ?? humanize(String(seg));
      label = row ? rowFieldLabel(row.noun, row.n, own) : own;
      row = null;
    }
  }
  return label || 'This request';
}

/** The label a form shows for one of a schema's fields ("model" → "Model"). */
export function labelOf(schema: Node, key: string): string {
  return labelAt(
    schema,
    key.split('.').map((k) => (/^\d+$/.test(k) ? Number(k) : k)),
  );
}

/** "“a”, “b” or “c”", each value in words ("in_review" → "in review"). */
export function orList(values: readonly unknown[]): string {
  const words = values.map((v) => `“${String(v).replace(/_/g, ' ')}”`);
  return words.length < 2 ? (words[0] ?? '') : `${words.slice(0, -1).join(', ')} or ${words.at(-1)}`;
}

const KIND_WORDS: Record<string, string> = {
  string: 'text',
  number: 'a number',
  int: 'a whole number',
  bigint: 'a whole number',
  boolean: 'yes or no',
  array: 'a list',
  object: 'a set of fields',
  date: 'a date',
  null: 'empty',
};

const FORMAT_WORDS: Record<string, string> = {
  email: 'is not a valid e-mail address',
  url: 'must be a web address',
  date: 'must be a date (YYYY-MM-DD)',
  datetime: 'must be a date and time',
  time: 'must be a time of day',
  regex: 'is not in the expected form',
  starts_with: 'is not in the expected form',
  ends_with: 'is not in the expected form',
  includes: 'is not in the expected form',
  lowercase: 'must be in lower case',
  uppercase: 'must be in upper case',
};

const count = (n: number | bigint, one: string, many: string) => `${n} ${Number(n) === 1 ? one : many}`;
const isSentence = (message: string | undefined) => !!message && /^[A-Z]/.test(message);

/** Nothing was given: known from the input where the parse reported it, else from zod's message. */
const isMissing = (issue: z.core.$ZodIssueInvalidType) =>
  'input' in issue
    ? issue.input === undefined || issue.input === null
    : /received (undefined|null)$/.test(issue.message);

/** The predicate of the sentence an issue makes ("is required", "must be at most 80 characters"). */
function predicate(issue: z.core.$ZodIssue): string {
  switch (issue.code) {
    case 'invalid_type':
      if (isMissing(issue)) return 'is required';
      return `must be ${KIND_WORDS[issue.expected] ?? issue.expected}`;
    case 'too_small': {
      const { minimum: min, inclusive, origin } = issue;
      if (origin === 'string')
        return Number(min) <= 1 ? 'is required' : `must be at least ${count(min, 'character', 'characters')}`;
      if (origin === 'array' || origin === 'set') return `needs at least ${count(min, 'entry', 'entries')}`;
      if (origin === 'date') return `must be on or after ${String(min)}`;
      return inclusive ? `must be at least ${String(min)}` : `must be greater than ${String(min)}`;
    }
    case 'too_big': {
      const { maximum: max, inclusive, origin } = issue;
      if (origin === 'string') return `must be at most ${count(max, 'character', 'characters')}`;
      if (origin === 'array' || origin === 'set') return `allows at most ${count(max, 'entry', 'entries')}`;
      if (origin === 'date') return `must be on or before ${String(max)}`;
      return inclusive ? `must be at most ${String(max)}` : `must be less than ${String(max)}`;
    }
    case 'invalid_value':
      return issue.values.length === 1
        ? `must be ${orList(issue.values)}`
        : `must be one of ${orList(issue.values)}`;
    case 'invalid_format':
      return FORMAT_WORDS[issue.format] ?? 'is not valid';
    case 'not_multiple_of':
      return `must be a multiple of ${String(issue.divisor)}`;
    case 'unrecognized_keys':
      return `has no field ${orList(issue.keys)}`;
    case 'invalid_key':
    case 'invalid_element':
      return 'has an entry that is not valid';
    case 'invalid_union':
      return 'is not valid';
    case 'custom':
      return 'is not valid';
  }
  return 'is not valid';
}

/** One issue as a sentence naming the field: a whole-sentence message of the schema's own is kept. */
export function sentence(issue: z.core.$ZodIssue, label: string): string {
  if (isSentence(issue.message) && !ZOD_ENGLISH.test(issue.message)) return issue.message;
  // A rule's own message is written as a predicate ("must be on one line"); zod's bare "Invalid input" is not.
  if (issue.code === 'custom' && issue.message && issue.message !== 'Invalid input')
    return withLabel(label, issue.message);
  return `${label} ${predicate(issue)}`;
}

/** How zod's own English messages begin (zod/v4/locales/en): never shown, only recognised. */
const ZOD_ENGLISH = /^(Invalid|Too (big|small)|Unrecognized key)\b/;

/** Every issue of a refused parse, named and worded; `where` prefixes the machine path ("body"). */
export function problemsOf(
  schema: Node | undefined,
  issues: readonly z.core.$ZodIssue[],
  where?: string,
): Problem[] {
  return issues.map((issue) => {
    const label = labelAt(schema, issue.path);
    return {
      field: [...(where ? [where] : []), ...issue.path.map(String)].join('.'),
      label,
      reason: sentence(issue, label),
    };
  });
}

const stop = (s: string) => (/[.?!]$/.test(s) ? s : `${s}.`);

/** The problems as one message for people: "Model is required. Serial is required." */
export function problemsMessage(problems: readonly { reason: string }[]): string {
  return problems.map((p) => stop(p.reason)).join(' ');
}

const PREDICATE =
  /^(is|are|must|needs?|has|have|allows|cannot|can’t|should|does|do|gives|takes|depends?|refers?)\b/;

/** A label and a reason as one sentence: a predicate follows the label ("… is required"), anything else a colon. */
export function withLabel(label: string, reason: string): string {
  return PREDICATE.test(reason) ? `${label} ${reason}` : `${label}: ${reason}`;
}
