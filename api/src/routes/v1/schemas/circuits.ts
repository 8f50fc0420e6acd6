import { CONDUCTOR_MATERIALS, DEVICE_KINDS } from '../../../models/circuit.js';
import { CircuitWarning } from './citation.js';
import { Id, Pagination, Timestamp, pageOf, z } from './common.js';

export const DeviceKind = z.enum(DEVICE_KINDS).openapi('DeviceKind', {
  description:
    'Overcurrent device: IEC 60898-1 breaker curve B, C or D; a North-American residential thermal-magnetic breaker (UL 489); or a fuse',
});

export const CircuitCreate = z
  .object({
    label: z.string().trim().min(1, 'must not be empty').max(200).openapi({ example: 'Kitchen counter, right' }),
    nominalVoltageV: z.number().positive().max(1000).openapi({ example: 120 }),
    mainsHz: z.union([z.literal(50), z.literal(60)]).openapi({ example: 60 }),
    deviceRatingA: z.number().positive().max(6000).openapi({ description: 'Overcurrent device rating in A', example: 20 }),
    deviceKind: DeviceKind,
    conductorSize: z
      .string()
      .trim()
      .max(20)
      .nullable()
      .optional()
      .openapi({ description: 'e.g. "12 AWG" or "2.5 mm2"', example: '12 AWG' }),
    conductorMaterial: z.enum(CONDUCTOR_MATERIALS).nullable().optional(),
    feedsOtherOutlets: z
      .boolean()
      .default(true)
      .openapi({ description: 'Whether the circuit also feeds lighting or other outlets (NEC 210.23)' }),
    necEdition: z
      .union([z.literal(2020), z.literal(2023)])
      .default(2023)
      .openapi({ description: 'NFPA 70 edition the check cites (clause numbers differ between editions)' }),
    notes: z.string().max(5000).nullable().optional(),
  })
  .strict()
  .openapi('CircuitCreate');

export const CircuitUpdate = CircuitCreate.partial().strict().openapi('CircuitUpdate');

export const Circuit = z
  .object({
    id: Id,
    siteId: Id,
    label: z.string(),
    nominalVoltageV: z.number(),
    mainsHz: z.number(),
    deviceRatingA: z.number(),
    deviceKind: DeviceKind,
    conductorSize: z.string().nullable(),
    conductorMaterial: z.enum(CONDUCTOR_MATERIALS).nullable(),
    feedsOtherOutlets: z.boolean(),
    necEdition: z.number().int(),
    notes: z.string().nullable(),
    loadCount: z.number().int(),
    warnings: z.array(CircuitWarning).openapi({
      description: 'Conductor too small for the device (NEC 240.4(D)), a rating outside NEC 240.6(A) or the IEC 60898-1 preferred values, or a device outside the trip models',
    }),
    createdAt: Timestamp,
    updatedAt: Timestamp,
  })
  .openapi('Circuit');

export const CircuitPage = pageOf(Circuit, 'CircuitPage');
export const CircuitParams = z.object({ circuitId: Id });
export const CircuitListQuery = Pagination.extend({ siteId: Id.optional() });
