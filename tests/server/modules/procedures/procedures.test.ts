import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fuseBlock, params } from '../../../support/documents';
import { createTestApp, type TestApp } from '../../../support/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const meta = {
  title: 'TC-18 mains fuse check',
  equipmentFamily: 'Guitar amplifier',
  equipmentModel: 'TC-18',
  tags: ['Fuse', 'first power-up'],
};

const docWith = (...blocks: unknown[]) => ({
  type: 'doc',
  content: [{ type: 'heading', attrs: { level: 2 }, content: [{ type: 'text', text: 'Fuse' }] }, ...blocks],
});

async function newDraft(author = 'hal' as const) {
  const c = await t.as(author);
  const res = await c.post('/api/procedures').send(meta);
  expect(res.status).toBe(201);
  return { c, revision: res.body.revision };
}

describe('procedures and drafts', () => {
  it('an author creates a procedure with an empty first draft; tags are normalised', async () => {
    const { revision } = await newDraft();
    expect(revision).toMatchObject({
      number: 1,
      state: 'draft',
      lockVersion: 1,
      tags: ['fuse', 'first power-up'],
    });
    expect(revision.document.type).toBe('doc');
  });

  it('saves a document and evaluates every reckoner on the server', async () => {
    const { c, revision } = await newDraft();
    const res = await c
      .put(`/api/revisions/${revision.id}`)
      .send({ ...meta, params, lockVersion: 1, document: docWith(fuseBlock('0.1 A')) });
    expect(res.status).toBe(200);
    expect(res.body.revision.lockVersion).toBe(2);
    const block = res.body.revision.snapshot.blocks[0];
    expect(block.ok).toBe(true);
    // 300 V × 0.1 A + 6.3 V × 2.5 A = 45.75 VA [derived: Σ V·I, docs/references.md §1]
    expect(block.outputs.totalVA.value).toBeCloseTo(45.75, 6);
    const reloaded = await c.get(`/api/revisions/${revision.id}`);
    expect(reloaded.body.revision.document).toEqual(docWith(fuseBlock('0.1 A')));
  });

  it('a stale save gets 409 with the current revision, and nothing is overwritten', async () => {
    const { c, revision } = await newDraft();
    const first = await c
      .put(`/api/revisions/${revision.id}`)
      .send({ ...meta, params, lockVersion: 1, document: docWith(fuseBlock('0.1 A')) });
    expect(first.status).toBe(200);
    const other = await t.as('ruth');
    const stale = await other
      .put(`/api/revisions/${revision.id}`)
      .send({ ...meta, params, lockVersion: 1, document: docWith(fuseBlock('0.2 A')) });
    expect(stale.status).toBe(409);
    expect(stale.body.current.lockVersion).toBe(2);
    expect(stale.body.current.document).toEqual(docWith(fuseBlock('0.1 A')));
  });

  it('a document with an unknown node, attribute or reckoner kind gets 400 naming it', async () => {
    const { c, revision } = await newDraft();
    const save = (document: unknown) =>
      c.put(`/api/revisions/${revision.id}`).send({ ...meta, params, lockVersion: 1, document });
    const iframe = await save(docWith({ type: 'iframe', attrs: { src: 'https://x.example' } }));
    expect(iframe.status).toBe(400);
    expect(iframe.body.fields[0]).toMatchObject({
      field: 'body.document.content.1.type',
      reason: 'unknown node type "iframe"',
    });
    const attr = await save({
      type: 'doc',
      content: [{ type: 'paragraph', attrs: { onclick: 'alert(1)' } }],
    });
    expect(attr.status).toBe(400);
    expect(attr.body.fields[0].field).toBe('body.document.content.0.attrs');
    const kind = await save(
      docWith({ type: 'reckoner', attrs: { id: 'abcdef12', name: 'x', kind: 'flux-capacitor', inputs: {} } }),
    );
    expect(kind.status).toBe(400);
    expect(kind.body.fields[0].reason).toMatch(/unknown reckoner kind "flux-capacitor"/);
    const input = await save(
      docWith({
        type: 'reckoner',
        attrs: { id: 'abcdef12', name: 'x', kind: 'mains-fuse', inputs: { warpFactor: 9 } },
      }),
    );
    expect(input.status).toBe(400);
    expect(input.body.fields[0].field).toBe('body.document.content.1.attrs.inputs.warpFactor');
    // Client-computed outputs are not an allowed attribute: the server computes its own.
    const outputs = await save(
      docWith({ ...fuseBlock('0.1 A'), attrs: { ...fuseBlock('0.1 A').attrs, outputs: { fuse: 99 } } }),
    );
    expect(outputs.status).toBe(400);
    // The draft kept what was saved before (nothing).
    expect((await c.get(`/api/revisions/${revision.id}`)).body.revision.lockVersion).toBe(1);
  });

  it('XSS payloads are refused or stored as inert text, never rendered as markup', async () => {
    const { c, revision } = await newDraft();
    const payloads = [
      '<script>alert(1)</script>',
      '<img src=x onerror=alert(1)>',
      '<svg onload=alert(1)><circle r=1></svg>',
      '"><iframe src=javascript:alert(1)>',
      '<a href="javascript:alert(1)">x</a>',
    ];
    const doc = {
      type: 'doc',
      content: payloads.map((p) => ({ type: 'paragraph', content: [{ type: 'text', text: p }] })),
    };
    const res = await c
      .put(`/api/revisions/${revision.id}`)
      .send({ ...meta, title: '<script>alert(1)</script> title', params, lockVersion: 1, document: doc });
    expect(res.status).toBe(200);
    const html: string = res.body.revision.html;
    // No such element, no event-handler attribute inside any tag, no javascript: link.
    expect(html).not.toMatch(/<(script|img|svg|iframe)\b/i);
    expect(html).not.toMatch(/<[^>]*\son\w+\s*=/i);
    expect(html).not.toMatch(/<a\b[^>]*href\s*=\s*"?\s*javascript:/i);
    expect(html).toContain('&lt;script&gt;');
    const link = await c.put(`/api/revisions/${revision.id}`).send({
      ...meta,
      params,
      lockVersion: 2,
      document: {
        type: 'doc',
        content: [
          {
            type: 'paragraph',
            content: [
              { type: 'text', text: 'x', marks: [{ type: 'link', attrs: { href: 'javascript:alert(1)' } }] },
            ],
          },
        ],
      },
    });
    expect(link.status).toBe(400);
    expect(link.body.fields[0].field).toMatch(/marks\.0\.attrs\.href$/);
  });

  it('a technician cannot write and does not see drafts', async () => {
    const { revision } = await newDraft();
    const tech = await t.as('tom');
    expect((await tech.post('/api/procedures').send(meta)).status).toBe(403);
    expect(
      (
        await tech
          .put(`/api/revisions/${revision.id}`)
          .send({ ...meta, params, lockVersion: 1, document: docWith() })
      ).status,
    ).toBe(403);
    expect((await tech.get(`/api/revisions/${revision.id}`)).status).toBe(404);
    const list = await tech.get('/api/procedures');
    expect(
      list.body.procedures.every((p: { latest: { state: string } }) =>
        ['approved', 'superseded'].includes(p.latest.state),
      ),
    ).toBe(true);
  });

  it('bad metadata gets 400 with each field named', async () => {
    const c = await t.as('hal');
    const res = await c
      .post('/api/procedures')
      .send({ title: 'x', equipmentFamily: '', equipmentModel: 'TC-18', tags: 'fuse' });
    expect(res.status).toBe(400);
    const fields = res.body.fields.map((f: { field: string }) => f.field).sort();
    expect(fields).toEqual(['body.equipmentFamily', 'body.tags', 'body.title']);
  });
});
