import { useMutation } from '@tanstack/react-query';
import type { AttachmentView } from '@shared/schemas/procedures';
import { api } from '@/lib/api-client';

/** Where a stored attachment is served; documents keep only the id. */
export const attachmentUrl = (attachmentId: string) => `/api/attachments/${encodeURIComponent(attachmentId)}`;

/** 413/415 come back as ApiError with the server's message. */
export const uploadAttachment = async (file: File) =>
  (await api.upload<{ attachment: AttachmentView }>('/api/attachments', file)).attachment;

export const useUploadAttachment = () => useMutation({ mutationFn: uploadAttachment });
