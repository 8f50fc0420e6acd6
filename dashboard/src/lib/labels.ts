/** Names shown for the API's enumerations (product vocabulary; the codes stay in the API). */
import type { components } from '@headroom/sdk';

type DeviceKind = components['schemas']['DeviceKind'];

export const deviceKindLabels: Record<DeviceKind, string> = {
  'iec-b': 'Breaker, IEC 60898-1 curve B',
  'iec-c': 'Breaker, IEC 60898-1 curve C',
  'iec-d': 'Breaker, IEC 60898-1 curve D',
  'na-thermal-magnetic': 'Breaker, thermal-magnetic (UL 489)',
  fuse: 'Fuse',
};

export function deviceKindLabel(kind: string): string {
  return (deviceKindLabels as Record<string, string>)[kind] ?? kind;
}

export const connectionLabels: Record<string, string> = {
  'cord-and-plug': 'Cord-and-plug',
  'fastened-in-place': 'Fastened in place',
};
