/**
 * A small LCS diff for reviewers: line by line, and word by word inside lines that changed.
 * Common leading and trailing lines are trimmed first, so the quadratic table only covers the
 * region that actually changed.
 */
export type DiffOp = 'same' | 'add' | 'del';
export interface DiffPart {
  op: DiffOp;
  text: string;
}
export interface DiffLine {
  kind: 'same' | 'added' | 'removed' | 'changed';
  parts: DiffPart[];
}

/** Largest region (in cells) we diff exactly; beyond it the region is shown as removed + added. */
const MAX_CELLS = 4_000_000;

/** Edit script between two token lists, from a longest-common-subsequence table. */
export function diffTokens(a: readonly string[], b: readonly string[]): { op: DiffOp; token: string }[] {
  let start = 0;
  while (start < a.length && start < b.length && a[start] === b[start]) start++;
  let endA = a.length;
  let endB = b.length;
  while (endA > start && endB > start && a[endA - 1] === b[endB - 1]) {
    endA--;
    endB--;
  }
  const head = a.slice(0, start).map((token) => ({ op: 'same' as const, token }));
  const tail = a.slice(endA).map((token) => ({ op: 'same' as const, token }));
  const midA = a.slice(start, endA);
  const midB = b.slice(start, endB);
  const n = midA.length;
  const m = midB.length;
  let middle: { op: DiffOp; token: string }[];
  if ((n + 1) * (m + 1) > MAX_CELLS) {
    middle = [
      ...midA.map((token) => ({ op: 'del' as const, token })),
      ...midB.map((token) => ({ op: 'add' as const, token })),
    ];
  } else {
    // lcs[i][j] = LCS length of midA[i..] and midB[j..], flattened.
    const w = m + 1;
    const lcs = new Uint32Array((n + 1) * w);
    for (let i = n - 1; i >= 0; i--) {
      for (let j = m - 1; j >= 0; j--) {
        lcs[i * w + j] =
          midA[i] === midB[j]
            ? lcs[(i + 1) * w + j + 1]! + 1
            : Math.max(lcs[(i + 1) * w + j]!, lcs[i * w + j + 1]!);
      }
    }
    middle = [];
    let i = 0;
    let j = 0;
    while (i < n && j < m) {
      if (midA[i] === midB[j]) {
        middle.push({ op: 'same', token: midA[i]! });
        i++;
        j++;
      } else if (lcs[(i + 1) * w + j]! >= lcs[i * w + j + 1]!) middle.push({ op: 'del', token: midA[i++]! });
      else middle.push({ op: 'add', token: midB[j++]! });
    }
    while (i < n) middle.push({ op: 'del', token: midA[i++]! });
    while (j < m) middle.push({ op: 'add', token: midB[j++]! });
  }
  return [...head, ...middle, ...tail];
}

/** Words and the whitespace between them, so joining the tokens gives back the line exactly. */
const words = (line: string) => line.match(/\s+|[^\s]+/g) ?? [];

/** Joins neighbouring tokens with the same op into parts. */
function merge(tokens: { op: DiffOp; token: string }[]): DiffPart[] {
  const parts: DiffPart[] = [];
  for (const t of tokens) {
    const last = parts[parts.length - 1];
    if (last && last.op === t.op) last.text += t.token;
    else parts.push({ op: t.op, text: t.token });
  }
  return parts;
}

export function diffText(before: string, after: string): DiffLine[] {
  const a = before.split('\n');
  const b = after.split('\n');
  const ops = diffTokens(a, b);
  const lines: DiffLine[] = [];
  let k = 0;
  while (k < ops.length) {
    const op = ops[k]!;
    if (op.op === 'same') {
      lines.push({ kind: 'same', parts: [{ op: 'same', text: op.token }] });
      k++;
      continue;
    }
    // A run of removed and added lines: pair them up and show word changes inside each pair.
    const removed: string[] = [];
    const added: string[] = [];
    while (k < ops.length && ops[k]!.op !== 'same') {
      (ops[k]!.op === 'del' ? removed : added).push(ops[k]!.token);
      k++;
    }
    const pairs = Math.min(removed.length, added.length);
    for (let p = 0; p < pairs; p++)
      lines.push({ kind: 'changed', parts: merge(diffTokens(words(removed[p]!), words(added[p]!))) });
    for (const line of removed.slice(pairs))
      lines.push({ kind: 'removed', parts: [{ op: 'del', text: line }] });
    for (const line of added.slice(pairs)) lines.push({ kind: 'added', parts: [{ op: 'add', text: line }] });
  }
  return lines;
}
