import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { testClientDir } from '../../server/bootstrap/prepare';

/**
 * Reads the client build the test command makes and proves the editor (TipTap and ProseMirror)
 * is only reachable through the editor route's lazy chunk: the entry and the reader never load it;
 * and the plotting library (visx) only through the lazy plot components of the pages that draw.
 */
const assets = path.join(testClientDir, 'assets');
const EDITOR_CODE = /\[tiptap (warn|error)\]|ProseMirror-hideselection|prosemirror-model|ProseMirror/;
/** Strings written in the route files themselves, so each route chunk is found by what it holds. */
const READER_MARK = 'not the approved procedure: do not use it at the bench';
const EDITOR_MARK = 'Only authors edit drafts.';
/** visx's own class names, present wherever its axis, grid or group code is. */
const PLOT_CODE = /visx-axis|visx-columns|visx-rows|visx-group/;
const PLOT_PAGES = { 'run sheet': 'Download PDF', unit: 'Trend of one reading across visits' };

let files: Map<string, string>;
let entry: string;

/** Static imports and re-exports of a chunk (not `import("…")`, which loads on demand). */
function staticImports(code: string): string[] {
  const found = new Set<string>();
  const pattern = /(?:^|[;}\s])(?:import|export)\s*(?:[\w$*{}\s,]+?\s*from\s*)?["']\.\/([\w.-]+\.js)["']/g;
  for (const m of code.matchAll(pattern)) found.add(m[1]!);
  return [...found];
}

/** Chunks a chunk loads on demand: `import("./…")` (the build writes it with backquotes). */
const dynamicImports = (code: string) =>
  [...code.matchAll(/import\(\s*["'`]\.\/([\w.-]+\.js)["'`]\s*\)/g)].map((m) => m[1]!);

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

describe('the plotting library loads only where a plot is drawn', () => {
  it('visx is in no chunk the entry, the reader or a plotting page loads statically; those pages reach it on demand', () => {
    const withPlotCode = [...files].filter(([, code]) => PLOT_CODE.test(code)).map(([name]) => name);
    expect(withPlotCode.length).toBeGreaterThan(0);
    const plotted = (names: string[]) => names.filter((n) => withPlotCode.includes(n));
    expect(plotted(closure(entry))).toEqual([]);
    expect(plotted(closure(chunkWith(READER_MARK)))).toEqual([]);
    for (const [page, mark] of Object.entries(PLOT_PAGES)) {
      const graph = closure(chunkWith(mark));
      expect(plotted(graph), `${page}: static imports`).toEqual([]);
      // Its own chunks' on-demand imports (not the entry's, which name every page).
      const onDemand = graph
        .filter((n) => !closure(entry).includes(n))
        .flatMap((n) => dynamicImports(files.get(n)!))
        .flatMap(closure);
      expect(plotted(onDemand).length, `${page}: a lazy chunk draws its plot`).toBeGreaterThan(0);
    }
    console.log(`visx in ${withPlotCode.join(', ')}: ${kB(withPlotCode)} kB`);
  });
});
