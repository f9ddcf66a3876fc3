import { useMutation } from '@tanstack/react-query';
import type { AttachmentView } from '@shared/schemas/procedures';
import { ApiError, getCsrfToken } from '@/lib/api-client';

/** Where a stored attachment is served; documents keep only the id. */
export const attachmentUrl = (attachmentId: string) => `/api/attachments/${encodeURIComponent(attachmentId)}`;

/** Multipart upload (field "file"); 413/415 come back as ApiError with the server's message. */
export async function uploadAttachment(file: File): Promise<AttachmentView> {
  const form = new FormData();
  form.append('file', file);
  let res: Response;
  try {
    res = await fetch('/api/attachments', {
      method: 'POST',
      body: form,
      headers: { Accept: 'application/json', 'X-CSRF-Token': getCsrfToken() },
      credentials: 'same-origin',
    });
  } catch {
    throw new ApiError(0, 'Cannot reach the Benchwright server; the file was not uploaded.');
  }
  const data = (await res.json().catch(() => ({}))) as { attachment?: AttachmentView; error?: string };
  if (!res.ok || !data.attachment) {
    const fallback =
      res.status === 413
        ? 'The file is too large.'
        : res.status === 415
          ? 'That type of file is not accepted.'
          : `Upload failed (${res.status}).`;
    throw new ApiError(res.status, data.error ?? fallback, [], data as Record<string, unknown>);
  }
  return data.attachment;
}

export const useUploadAttachment = () => useMutation({ mutationFn: uploadAttachment });
