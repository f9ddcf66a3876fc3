/**
 * The stylesheet's safety-sign colours come from shared/safety-signs.ts and nowhere else: the
 * compiled CSS declares each level's field and ink as theme variables with the values of
 * SAFETY_SIGNS, and no stylesheet or component spells a hazard colour of its own.
 */
import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { compile } from '@tailwindcss/node';
import { describe, expect, it } from 'vitest';
import { SAFETY_SIGNS, SIGNAL_LEVELS, WARNING_TRIANGLE } from '../../shared/safety-signs';

const src = path.join(import.meta.dirname, '../../src');

async function compiledCss() {
  const css = readFileSync(path.join(src, 'styles.css'), 'utf8');
  const compiler = await compile(css, { base: src, onDependency: () => undefined });
  return compiler.build([
    'bg-sign-danger',
    'text-sign-caution-ink',
    'border-sign-warning',
    'bg-sign-notice/20',
  ]);
}

const files = (dir: string): string[] =>
  readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? files(path.join(dir, e.name)) : [path.join(dir, e.name)],
  );

describe('safety-sign colours in the theme', () => {
  it('declares every level’s field and ink with the values of SAFETY_SIGNS', async () => {
    const css = await compiledCss();
    for (const level of SIGNAL_LEVELS) {
      const sign = SAFETY_SIGNS[level];
      expect(css).toContain(`--color-sign-${level}: ${sign.field};`);
      expect(css).toContain(`--color-sign-${level}-ink: ${sign.ink};`);
    }
    // The utilities read those variables.
    expect(css).toMatch(/\.bg-sign-danger\s*{\s*background-color: var\(--color-sign-danger\);/);
    expect(css).toMatch(/\.border-sign-warning\s*{\s*border-color: var\(--color-sign-warning\);/);
  }, 30_000);

  it('leaves no other hazard colour in the client (no --color-hazard, no sign hex outside the one definition)', () => {
    const hexes = new Set(
      [...SIGNAL_LEVELS.map((l) => SAFETY_SIGNS[l].field), WARNING_TRIANGLE.field].map((h) =>
        h.toLowerCase(),
      ),
    );
    const found: string[] = [];
    for (const file of files(src).filter((f) => /\.(css|tsx?)$/.test(f))) {
      const text = readFileSync(file, 'utf8').toLowerCase();
      if (/(--color-|\b(bg|text|border)-)hazard\b/.test(text)) found.push(`${file}: a hazard colour token`);
      for (const hex of hexes) if (text.includes(hex)) found.push(`${file}: ${hex}`);
    }
    expect(found).toEqual([]);
  });
});
