import { z } from 'zod';
import { benchSheetQuery, paperSheetBody } from '../../../shared/schemas/paper-sheets';
import { idIn } from '../../http/params';
import { defineRoute } from '../../http/route';
import { loadRunView } from '../runs/run-view';
import { renderBenchSheetPdf } from './bench-sheet-pdf';
import { benchSheet, setPaperSheet } from './paper-sheets.service';

export const paperSheetRoutes = [
  defineRoute({
    method: 'get',
    path: '/revisions/:id/bench-sheet.pdf',
    access: 'signed-in',
    summary:
      'A blank bench sheet of an approved revision as a PDF: each step with a box, each reading with its expected value and band worked out for the mains asked for',
    params: z.object({ id: idIn('revision') }).strict(),
    query: benchSheetQuery,
    handler: async ({ res, params, query, user, deps }) => {
      const sheet = await benchSheet(deps.db, deps.files, user!, params.id, query);
      const pdf = await renderBenchSheetPdf(sheet);
      res.set({
        'Content-Type': 'application/pdf',
        'Content-Length': String(pdf.length),
        'Content-Disposition': `attachment; filename="bench-sheet-${sheet.sheetId}.pdf"`,
        'X-Content-Type-Options': 'nosniff',
        'Cache-Control': 'private, no-store',
      });
      res.end(pdf);
    },
  }),

  defineRoute({
    method: 'put',
    path: '/runs/:id/paper-sheet',
    access: ['technician'],
    summary:
      'The entries that follow are copied from a paper bench sheet dated so (null: made at the bench again); its performer only, while the run is open',
    params: z.object({ id: idIn('run') }).strict(),
    body: paperSheetBody,
    handler: async ({ params, body, user, deps }) => {
      const row = await setPaperSheet(deps.db, user!, params.id, body.paperSheet);
      return { run: await loadRunView(deps.db, deps.files, params.id, row) };
    },
  }),
];
