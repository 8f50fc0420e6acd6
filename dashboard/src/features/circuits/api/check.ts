import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { unwrap, type components } from '@headroom/sdk';
import { sdk } from '../../../lib/sdk';

export type HeadroomCheck = components['schemas']['HeadroomCheck'];
export type WhatIfLoad = components['schemas']['WhatIfLoad'];
export type Verdict = components['schemas']['Verdict'];

export const circuitCheckOptions = (circuitId: string) =>
  queryOptions({
    queryKey: ['checks', 'circuit', circuitId],
    queryFn: () => unwrap(sdk.GET('/circuits/{circuitId}/check', { params: { path: { circuitId }, query: {} } })),
  });

export const useCircuitCheck = (circuitId: string) => useQuery(circuitCheckOptions(circuitId));

/** The check with hypothetical loads added; nothing is stored. */
export function useWhatIfCheck(circuitId: string) {
  return useMutation({
    mutationFn: (extraLoads: WhatIfLoad[]) =>
      unwrap(sdk.POST('/circuits/{circuitId}/check', { params: { path: { circuitId } }, body: { extraLoads } })),
  });
}
