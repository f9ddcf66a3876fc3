import type { RevisionView, SaveRevisionBody } from '@shared/schemas/procedures';
import { api } from '@/lib/api-client';

/** PUT a draft. 400 carries fields (body.document.content.3.attrs.kind …); 409 carries `current`. */
export const saveRevision = (id: string, body: SaveRevisionBody) =>
  api.put<{ revision: RevisionView }>(
    `/api/revisions/${encodeURIComponent(id)}`,
    body as unknown as Record<string, unknown>,
  );
