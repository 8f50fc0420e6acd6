import { useMutation, useQueryClient } from '@tanstack/react-query';
import { multipartBody, sendBody, unwrap, type components, type UploadProgress } from '@headroom/sdk';
import { headroom, sdk } from '../../../lib/sdk';

export type ImportResult = components['schemas']['ImportResult'];

/** Form fields of POST /traces/import, as text (multipart); absent fields are left out. */
export type ImportFields = Record<string, string | number | undefined>;

/**
 * Uploads a CSV file and its mapping to POST /traces/import through the SDK's replayable upload, which
 * reports real byte progress (XMLHttpRequest upload events in the browser) and retries safely with one
 * Idempotency-Key. Then, when asked, closes the new trace so its analysis is stored.
 */
export function useImportTrace(onProgress: (p: UploadProgress) => void) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async ({ file, fields, closeAfter }: { file: File; fields: ImportFields; closeAfter: boolean }) => {
      const { body, contentType } = multipartBody(fields, {
        field: 'file',
        name: file.name,
        type: file.type || 'text/csv',
        content: file,
      });
      const response = await sendBody(headroom.context, {
        method: 'POST',
        path: '/traces/import',
        headers: { 'Content-Type': contentType },
        body,
        onProgress,
        // A large file may take the server a while to read: no per-attempt time limit.
        retry: { attemptTimeoutMs: 0 },
      });
      const result = (await response.json()) as ImportResult;
      // The trace exists now whatever happens next: a failed close is reported, not thrown, and the
      // trace page offers "Close trace" again.
      let closeError: unknown = null;
      if (closeAfter)
        await unwrap(sdk.POST('/traces/{traceId}/close', { params: { path: { traceId: result.trace.id } } })).catch(
          (e: unknown) => (closeError = e),
        );
      return { result, closeError };
    },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['traces'] }),
  });
}
