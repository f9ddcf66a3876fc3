import { z } from 'zod';
import { HttpError } from '../../http/errors';
import { sendJson } from '../../http/library-cache';
import { defineRoute } from '../../http/route';

const searchQuery = z.object({
  q: z.string().max(200).meta({ title: 'Search words' }).default(''),
  family: z.string().max(80).meta({ title: 'Equipment family' }).optional(),
  tag: z.string().max(40).optional(),
  page: z.coerce.number().int('a whole page number').min(1).max(500).default(1),
  pageSize: z.coerce.number().int().min(1).max(50).default(10),
});

export const searchRoutes = [
  defineRoute({
    method: 'get',
    path: '/search',
    access: 'signed-in',
    summary: 'Search approved procedures (trade vocabulary, typo-tolerant), with filters and paging',
    query: searchQuery,
    // Searches approved revisions only, the same for everyone: kept until the library changes.
    handler: async ({ req, res, query, deps }) => {
      const search = deps.search;
      if (!search) throw new HttpError(503, 'Search is starting up; try again in a moment.');
      const body = await deps.library.answer(`search:${JSON.stringify(query)}`, () =>
        search.index.search(query.q, {
          family: query.family,
          tag: query.tag?.toLowerCase(),
          page: query.page,
          pageSize: query.pageSize,
        }),
      );
      sendJson(req, res, body);
    },
  }),
];
