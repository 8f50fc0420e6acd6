import { useMutation } from '@tanstack/react-query';
import { unwrap } from '@headroom/sdk';
import { saveBlob } from '../../../lib/download';
import { sdk } from '../../../lib/sdk';

export type ReportFormat = 'pdf' | 'csv';
export type ReportTarget = { circuitId: string } | { siteId: string };

/**
 * Downloads a report through the SDK (a plain link would not carry the bearer token) and saves it.
 */
export function useDownloadReport() {
  return useMutation({
    mutationFn: async ({ target, format }: { target: ReportTarget; format: ReportFormat }) => {
      const call =
        'circuitId' in target
          ? sdk.GET('/circuits/{circuitId}/report', {
              params: { path: { circuitId: target.circuitId }, query: { format } },
              parseAs: 'blob',
            })
          : sdk.GET('/sites/{siteId}/report', {
              params: { path: { siteId: target.siteId }, query: { format } },
              parseAs: 'blob',
            });
      const result = await call;
      const blob = (await unwrap(Promise.resolve(result))) as unknown as Blob;
      const id = 'circuitId' in target ? target.circuitId : target.siteId;
      saveBlob(blob, `headroom-${'circuitId' in target ? 'circuit' : 'site'}-${id}.${format}`, result.response);
    },
  });
}

export function useEmailReport(circuitId: string) {
  return useMutation({
    mutationFn: (body: { to: string; message?: string }) =>
      unwrap(sdk.POST('/circuits/{circuitId}/report/email', { params: { path: { circuitId } }, body })),
  });
}
