/**
 * Uploads of the current lab: time data run through a recipe, or an FRF scored against a
 * scenario's exact FRF. The file goes as multipart form data (field `file`), so this module sends
 * it with fetch itself and reads failures the same way the JSON client does.
 */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiErrorSchema } from '@/shared/api/auth';
import { uploadListSchema, uploadResultSchema, type UploadFields, type UploadResult } from '@/shared/api/work';
import { api, ApiRequestError } from './client';
import { labPath } from './labs';

export const uploadKeys = {
  all: ['uploads'] as const,
  list: (labId: string) => [...uploadKeys.all, labId, 'list'] as const,
  result: (labId: string, id: string) => [...uploadKeys.all, labId, 'result', id] as const,
};

export function useUploads(labId: string) {
  return useQuery({
    queryKey: uploadKeys.list(labId),
    queryFn: ({ signal }) => api.get(labPath(labId, '/uploads?limit=50'), { schema: uploadListSchema, signal }),
    enabled: labId !== '',
  });
}

export function useUploadResult(labId: string, id: string) {
  return useQuery({
    queryKey: uploadKeys.result(labId, id),
    queryFn: ({ signal }) => api.get(labPath(labId, `/uploads/${encodeURIComponent(id)}/result`), { schema: uploadResultSchema, signal }),
    enabled: labId !== '' && id !== '',
    staleTime: Infinity,
  });
}

/** POSTs the form; the answer is checked with the shared schema. */
export async function postUpload(labId: string, file: Blob, fileName: string, fields: UploadFields): Promise<UploadResult> {
  const form = new FormData();
  for (const [key, value] of Object.entries(fields)) if (value !== undefined) form.append(key, String(value));
  form.append('file', file, fileName);
  let response: Response;
  try {
    response = await fetch(labPath(labId, '/uploads'), { method: 'POST', body: form, credentials: 'include', headers: { Accept: 'application/json' } });
  } catch (cause) {
    throw new ApiRequestError(0, 'unreachable', "Plumbline's server could not be reached. Check the connection and try again.", cause);
  }
  const text = await response.text();
  let payload: unknown;
  try {
    payload = text ? JSON.parse(text) : undefined;
  } catch {
    payload = undefined;
  }
  if (!response.ok) {
    const parsed = apiErrorSchema.safeParse(payload);
    const message = parsed.success ? parsed.data.error.message : response.status === 413 ? 'The file is too large.' : `The upload failed (HTTP ${response.status}).`;
    throw new ApiRequestError(response.status, parsed.success ? parsed.data.error.code : `http_${response.status}`, message, parsed.success ? parsed.data.error.details : undefined);
  }
  const checked = uploadResultSchema.safeParse(payload);
  if (!checked.success) throw new ApiRequestError(response.status, 'unexpected_response', "The server's answer was not understood.", checked.error.issues);
  return checked.data;
}

export function useUpload(labId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: { file: Blob; fileName: string; fields: UploadFields }) => postUpload(labId, input.file, input.fileName, input.fields),
    onSuccess: (result) => {
      client.setQueryData(uploadKeys.result(labId, result.upload.id), result);
      void client.invalidateQueries({ queryKey: uploadKeys.list(labId) });
    },
  });
}
