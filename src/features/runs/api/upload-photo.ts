import { ApiError, getCsrfToken } from '@/lib/api-client';

/** Multipart upload of one photo (the JSON client cannot send files); same errors as `api`. */
export async function uploadPhoto<T>(
  url: string,
  file: File,
  fields: Record<string, string> = {},
): Promise<T> {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  form.append('file', file);
  let res: Response;
  try {
    res = await fetch(url, {
      method: 'POST',
      body: form,
      headers: { 'X-CSRF-Token': getCsrfToken(), Accept: 'application/json' },
      credentials: 'same-origin',
    });
  } catch {
    throw new ApiError(0, 'Cannot reach the Benchwright server; the photo was not sent.');
  }
  const data = (await res.json().catch(() => ({}))) as Record<string, unknown>;
  if (!res.ok)
    throw new ApiError(
      res.status,
      typeof data.error === 'string' ? data.error : `The server answered ${res.status}.`,
      (data.fields as never) ?? [],
      data,
    );
  return data as T;
}
