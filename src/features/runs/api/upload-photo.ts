import type { RunPhotoView } from '@shared/schemas/runs';
import { api } from '@/lib/api-client';

/** One photo for one step of a run. */
export const uploadStepPhoto = (runId: string, stepId: string, file: File) =>
  api.upload<{ photo: RunPhotoView }>(`/api/runs/${encodeURIComponent(runId)}/photos`, file, { stepId });
