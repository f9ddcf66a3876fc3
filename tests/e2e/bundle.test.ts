import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { testClientDir } from '../../server/bootstrap/prepare';

/**
 * Reads the client build the test command makes and proves the editor (TipTap and ProseMirror)
 * is only reachable through the editor route's lazy chunk: the entry and the reader never load it.
 */
const assets = path.join(testClientDir, 'assets');
const EDITOR_CODE = /\[tiptap (warn|error)\]|ProseMirror-hideselection|prosemirror-model|ProseMirror/;
/** Strings written in the route files themselves, so each route chunk is found by what it holds. */
const READER_MARK = 'not the approved procedure: do not use it at the bench';
const EDITOR_MARK = 'Only authors edit drafts.';

let files: Map<string, string>;
let entry: string;

/** Static imports and re-exports of a chunk (not `import("…")`, which loads on demand). */
function staticImports(code: string): string[] {
  const found = new Set<string>();
  const pattern = /(?:^|[;}\s])(?:import|export)\s*(?:[\w$*{}\s,]+?\s*from\s*)?["']\.\/([\w.-]+\.js)["']/g;
  for (const m of code.matchAll(pattern)) found.add(m[1]!);
  return [...found];
}

function closure(start: string): string[] {
  const seen = new Set<string>();
  const visit = (name: string) => {
    if (seen.has(name)) return;
    seen.add(name);
    const code = files.get(name);
    if (code === undefined) throw new Error(`${name} is imported but not in the build`);
    staticImports(code).forEach(visit);
  };
  visit(start);
  return [...seen];
}

const kB = (names: string[]) =>
  (names.reduce((sum, n) => sum + statSync(path.join(assets, n)).size, 0) / 1024).toFixed(1);
const chunkWith = (mark: string) => {
  const hits = [...files].filter(([, code]) => code.includes(mark)).map(([name]) => name);
  expect(hits, `exactly one chunk holds "${mark}"`).toHaveLength(1);
  return hits[0]!;
};

beforeAll(() => {
  if (!existsSync(assets))
    throw new Error(
      `No client build in ${testClientDir}: run the tests through "npm test", which builds it first.`,
    );
  files = new Map(
    readdirSync(assets)
      .filter((f) => f.endsWith('.js'))
      .map((f) => [f, readFileSync(path.join(assets, f), 'utf8')]),
  );
  const html = readFileSync(path.join(testClientDir, 'index.html'), 'utf8');
  entry = /<script type="module"[^>]*src="\/assets\/([\w.-]+\.js)"/.exec(html)![1]!;
});

describe('the editor stays out of the reader’s download', () => {
  it('the import reader sees real static imports and ignores dynamic ones', () => {
    expect(
      staticImports(
        'import{a as b}from"./one-1.js";import"./two-2.js";export{c}from"./three-3.js";const x=()=>import("./lazy-4.js")',
      ),
    ).toEqual(['one-1.js', 'two-2.js', 'three-3.js']);
  });

  it('only the editor route’s static graph holds TipTap / ProseMirror code', () => {
    const withEditorCode = [...files].filter(([, code]) => EDITOR_CODE.test(code)).map(([name]) => name);
    expect(withEditorCode.length).toBeGreaterThan(0);

    const reader = chunkWith(READER_MARK);
    const editor = chunkWith(EDITOR_MARK);
    const entryGraph = closure(entry);
    const readerGraph = closure(reader);
    const editorGraph = closure(editor);

    expect(entryGraph.filter((n) => withEditorCode.includes(n))).toEqual([]);
    expect(readerGraph.filter((n) => withEditorCode.includes(n))).toEqual([]);
    expect(editorGraph.filter((n) => withEditorCode.includes(n)).length).toBeGreaterThan(0);
    // The entry may name the editor chunk for lazy loading, but never imports it statically.
    expect(entryGraph).not.toContain(editor);
    expect(readerGraph).not.toContain(editor);

    const own = (names: string[], base: string[]) => names.filter((n) => !base.includes(n));
    console.log(
      [
        `entry ${entry}: ${kB([entry])} kB (with static imports ${kB(entryGraph)} kB)`,
        `reader ${reader}: ${kB([reader])} kB (+${kB(own(readerGraph, entryGraph))} kB beyond the entry)`,
        `editor ${editor}: ${kB([editor])} kB (+${kB(own(editorGraph, entryGraph))} kB beyond the entry)`,
      ].join('\n'),
    );
  });
});
