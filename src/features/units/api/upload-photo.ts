import type { UnitPhotoView } from '@shared/schemas/units';
import { api } from '@/lib/api-client';

/** One photo of a unit, with its caption. */
export const uploadUnitPhoto = (unitId: string, file: File, caption: string) =>
  api.upload<{ photo: UnitPhotoView }>(`/api/units/${encodeURIComponent(unitId)}/photos`, file, { caption });
