import type { QueryClient } from '@tanstack/react-query';
import { circuitCheckOptions } from './check';
import { circuitOptions } from './circuits';
import { circuitLoadsOptions } from './loads';

/** Starts the circuit page's requests as soon as the route is entered (see the traces' prefetch). */
export function prefetchCircuitPage(queryClient: QueryClient, circuitId: string): void {
  void queryClient.prefetchQuery(circuitOptions(circuitId));
  void queryClient.prefetchQuery(circuitLoadsOptions(circuitId));
  void queryClient.prefetchQuery(circuitCheckOptions(circuitId));
}
