import { LOAD_CONNECTIONS } from '../../../models/load.js';
import { Id, Pagination, Timestamp, pageOf, z } from './common.js';

const amps = (description: string) => z.number().positive().max(10_000).openapi({ description });

/**
 * What a load draws, by nameplate: shared by stored loads and the hypothetical loads of a what-if check.
 * Cross-field rules (a running figure is needed, a code letter needs horsepower…) are checked by the loads
 * service so that a PATCH is judged on the merged result.
 */
export const LoadFigureFields = {
  name: z.string().trim().min(1, 'must not be empty').max(200).openapi({ example: 'Stand mixer (20 qt)' }),
  nameplateA: amps('Nameplate (rated or running) current, A').nullable().optional().openapi({ example: 9.5 }),
  nameplateW: z
    .number()
    .positive()
    .max(10_000_000)
    .nullable()
    .optional()
    .openapi({ description: 'Nameplate power, W (converted at the circuit voltage and power factor)', example: 1500 }),
  powerFactor: z
    .number()
    .gt(0)
    .max(1)
    .nullable()
    .optional()
    .openapi({ description: 'Power factor for watts → amps; 1 (resistive) when omitted', example: 0.85 }),
  connection: z.enum(LOAD_CONNECTIONS).openapi({
    description: 'Cord-and-plug connected (not fastened in place) or fastened in place (NEC 210.23)',
  }),
  continuous: z
    .boolean()
    .default(false)
    .openapi({ description: 'Maximum current expected to last 3 hours or more (NEC Article 100)' }),
  motorHp: z
    .number()
    .positive()
    .max(1000)
    .nullable()
    .optional()
    .openapi({ description: 'Motor horsepower (full-load current from NEC Table 430.248 when no nameplate amps)', example: 0.5 }),
  lockedRotorCode: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^[A-HJ-NPR-V]$/, 'must be a code letter of NEC Table 430.7(B): A–V without I, O and Q')
    .nullable()
    .optional()
    .openapi({ description: 'Locked-rotor indicating code letter (NEC 430.7(B))', example: 'J' }),
  startPeakA: amps('Start-up peak RMS current from the nameplate or maker (e.g. a compressor\'s LRA), A')
    .nullable()
    .optional()
    .openapi({ example: 52 }),
  startDurationS: z
    .number()
    .positive()
    .max(600)
    .nullable()
    .optional()
    .openapi({ description: 'How long the start-up peak lasts, s', example: 0.3 }),
};

export const LoadCreate = z
  .object({
    ...LoadFigureFields,
    notes: z.string().max(5000).nullable().optional(),
    traceIds: z
      .array(Id)
      .max(50)
      .optional()
      .openapi({ description: 'Traces recorded on this load (sets each trace\'s loadId; replaces the previous links)' }),
  })
  .strict()
  .openapi('LoadCreate');

export const LoadUpdate = LoadCreate.partial().strict().openapi('LoadUpdate');

export const Load = z
  .object({
    id: Id,
    circuitId: Id,
    name: z.string(),
    nameplateA: z.number().nullable(),
    nameplateW: z.number().nullable(),
    powerFactor: z.number().nullable(),
    connection: z.enum(LOAD_CONNECTIONS),
    continuous: z.boolean(),
    motorHp: z.number().nullable(),
    lockedRotorCode: z.string().nullable(),
    startPeakA: z.number().nullable(),
    startDurationS: z.number().nullable(),
    notes: z.string().nullable(),
    traceIds: z.array(Id).openapi({ description: 'Traces linked to this load' }),
    createdAt: Timestamp,
    updatedAt: Timestamp,
  })
  .openapi('Load');

export const LoadPage = pageOf(Load, 'LoadPage');
export const LoadParams = z.object({ loadId: Id });
export const LoadListQuery = Pagination.extend({});
