/**
 * The browser tests' draft with every kind of block (tests/support/every-kind-document.ts) stays
 * complete as the registries grow: every node type, reckoner kind, check-step kind and signal level.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { CHECK_KINDS, NODE_TYPES, type DocNode } from '../../../shared/document/nodes';
import type { ProcedureDoc } from '../../../shared/document/schema';
import { RECKONER_KINDS } from '../../../shared/reckoners';
import { SIGNAL_LEVELS } from '../../../shared/safety-signs';
import { everyKindDocument, nodeTypesIn } from '../../support/every-kind-document';

const seed = JSON.parse(
  readFileSync(
    path.join(import.meta.dirname, '../../../content-seed/procedures/tc18-first-power-up.json'),
    'utf8',
  ),
) as { document: ProcedureDoc };

const all = (n: DocNode): DocNode[] => [n, ...(n.content ?? []).flatMap(all)];

describe('the draft with every kind of block', () => {
  const doc = everyKindDocument(seed.document, '00000000-0000-4000-8000-000000000001');
  const nodes = all(doc);

  it('holds every node type of the registry', () => {
    expect([...nodeTypesIn(doc)].sort()).toEqual([...NODE_TYPES].sort());
  });

  it('holds every reckoner kind, check-step kind, hazard level and a hold point, with unique reckoner names', () => {
    const attr = (type: string, key: string) =>
      nodes.filter((n) => n.type === type).map((n) => n.attrs?.[key] ?? 'confirm');
    expect(new Set(attr('reckoner', 'kind'))).toEqual(new Set(RECKONER_KINDS));
    expect(new Set(attr('checkStep', 'kind'))).toEqual(new Set(CHECK_KINDS));
    expect(new Set(attr('hazardNote', 'level'))).toEqual(new Set(SIGNAL_LEVELS));
    expect(nodes.some((n) => n.type === 'reading' && n.attrs?.holdPoint === true)).toBe(true);
    const names = attr('reckoner', 'name');
    expect(new Set(names).size).toBe(names.length);
  });

  it('throws when the base document cannot take the samples (a clash the app would refuse)', () => {
    const clash: ProcedureDoc = { type: 'doc', content: [{ type: 'bogus' }] };
    expect(() => everyKindDocument(clash, '00000000-0000-4000-8000-000000000001')).toThrow(
      /not a valid document/,
    );
  });
});
