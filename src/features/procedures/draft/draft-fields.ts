import type { ProcedureParams } from '@shared/document/params';
import type { ProcedureDoc } from '@shared/document/schema';
import type { RevisionView } from '@shared/schemas/procedures';

/** Everything an author edits in a draft: the save body without its lock version. */
export interface DraftFields {
  title: string;
  equipmentFamily: string;
  equipmentModel: string;
  tags: string[];
  params: ProcedureParams;
  document: ProcedureDoc;
}

export const draftFromRevision = (r: RevisionView): DraftFields => ({
  title: r.title,
  equipmentFamily: r.equipmentFamily,
  equipmentModel: r.equipmentModel,
  tags: r.tags,
  params: r.params,
  document: r.document,
});

export const sameDraft = (a: DraftFields, b: DraftFields) => JSON.stringify(a) === JSON.stringify(b);
