/**
 * The demo organisation: invented people, places and equipment in a scenario of our own, for trying
 * Headroom out. Nothing here is a reference for tests of the computations.
 *
 * Scenario: Millbrook Community Hall is refitting its kitchen. The hall committee wants to know whether
 * the new stand mixer and the hot-water urn can share the counter circuit, and why the walk-in cooler's
 * breaker sometimes trips. A second site, a small joinery workshop on a 230 V / 50 Hz supply, has an air
 * compressor on a C16 breaker.
 */
import bcrypt from 'bcryptjs';
import { formatApiKey, hashSecret } from '../api/src/auth/secrets.js';
import type { Db } from '../api/src/db/open.js';
import type { Role } from '../api/src/models/user.js';
import type { DeviceKind } from '../api/src/models/circuit.js';
import type { LoadConnection } from '../api/src/models/load.js';
import type { ProbeSettings, TraceKind } from '../api/src/models/trace.js';
import {
  compressorCyclingRms,
  motorStartRms,
  motorStartWaveform,
  resistiveHeaterRms,
} from './scenarios/physical-models.js';

export const DEMO_ORGANISATION = { id: '00000000-0000-4000-8000-000000000001', name: 'Brightwire Electrical (demo)' };

/** Demo sign-in, printed at start. Demo data only. */
export const DEMO_USERS: Array<{ id: string; email: string; name: string; role: Role; password: string }> = [
  { id: '00000000-0000-4000-8000-0000000000a1', email: 'admin@demo.headroom.test', name: 'Ada Okafor', role: 'admin', password: 'demo-admin-pass' },
  { id: '00000000-0000-4000-8000-0000000000a2', email: 'engineer@demo.headroom.test', name: 'Tomás Lindqvist', role: 'engineer', password: 'demo-engineer-pass' },
  { id: '00000000-0000-4000-8000-0000000000a3', email: 'viewer@demo.headroom.test', name: 'Priya Nandakumar', role: 'viewer', password: 'demo-viewer-pass' },
];

/**
 * Demo API key (scopes ingest and read), printed at start while it is active. Demo data only: it is
 * public, so revoke it (DELETE /api/v1/api-keys/de30000000000001) before real use.
 */
export const DEMO_API_KEY = {
  id: 'de30000000000001',
  name: 'Demo integration key (demo only)',
  scopes: ['ingest', 'read'] as Array<'ingest' | 'read'>,
  secret: 'demo-only-key-revoke-before-real-use-000000',
};
export const DEMO_API_KEY_TOKEN = formatApiKey(DEMO_API_KEY.id, DEMO_API_KEY.secret);

interface DemoCircuit {
  id: string;
  siteId: string;
  label: string;
  nominalVoltageV: number;
  mainsHz: 50 | 60;
  deviceRatingA: number;
  deviceKind: DeviceKind;
  conductorSize: string;
  conductorMaterial: 'cu' | 'al';
  feedsOtherOutlets: boolean;
  notes: string;
}

const HALL = '00000000-0000-4000-8000-0000000000b1';
const WORKSHOP = '00000000-0000-4000-8000-0000000000b2';

export const DEMO_SITES = [
  {
    id: HALL,
    name: 'Millbrook Community Hall',
    address: '14 Tanner Row, Millbrook',
    clientContact: 'Hall committee — R. Osei, bookings@millbrook-hall.test',
    notes: 'Kitchen refit. Panel in the store room behind the stage.',
  },
  {
    id: WORKSHOP,
    name: 'Fenwick Joinery workshop',
    address: 'Unit 3, Quarry Lane Estate',
    clientContact: 'M. Fenwick',
    notes: '230 V / 50 Hz supply, DIN-rail consumer unit.',
  },
];

export const DEMO_CIRCUITS: DemoCircuit[] = [
  {
    id: '00000000-0000-4000-8000-0000000000c1',
    siteId: HALL,
    label: 'Kitchen counter, left (K3)',
    nominalVoltageV: 120,
    mainsHz: 60,
    deviceRatingA: 20,
    deviceKind: 'na-thermal-magnetic',
    conductorSize: '12 AWG',
    conductorMaterial: 'cu',
    feedsOtherOutlets: true,
    notes: 'Small-appliance circuit; also feeds two counter receptacles by the sink.',
  },
  {
    id: '00000000-0000-4000-8000-0000000000c2',
    siteId: HALL,
    label: 'Walk-in cooler (K7)',
    nominalVoltageV: 120,
    mainsHz: 60,
    deviceRatingA: 15,
    deviceKind: 'na-thermal-magnetic',
    conductorSize: '14 AWG',
    conductorMaterial: 'cu',
    feedsOtherOutlets: false,
    notes: 'Individual circuit. Committee reports occasional trips on hot afternoons.',
  },
  {
    id: '00000000-0000-4000-8000-0000000000c3',
    siteId: WORKSHOP,
    label: 'Bench sockets (C16)',
    nominalVoltageV: 230,
    mainsHz: 50,
    deviceRatingA: 16,
    deviceKind: 'iec-c',
    conductorSize: '2.5 mm2',
    conductorMaterial: 'cu',
    feedsOtherOutlets: true,
    notes: 'Radial to the bench; the compressor is plugged in here.',
  },
];

interface DemoLoad {
  id: string;
  circuitId: string;
  name: string;
  nameplateA: number | null;
  nameplateW: number | null;
  powerFactor: number | null;
  connection: LoadConnection;
  continuous: boolean;
  motorHp: number | null;
  lockedRotorCode: string | null;
  notes: string | null;
}

export const DEMO_LOADS: DemoLoad[] = [
  { id: '00000000-0000-4000-8000-0000000000d1', circuitId: DEMO_CIRCUITS[0]!.id, name: 'Stand mixer (20 qt)', nameplateA: 9.5, nameplateW: null, powerFactor: 0.85, connection: 'cord-and-plug', continuous: false, motorHp: 0.5, lockedRotorCode: 'J', notes: 'Planetary mixer, run on dough hook at speed 2.' },
  { id: '00000000-0000-4000-8000-0000000000d2', circuitId: DEMO_CIRCUITS[0]!.id, name: 'Hot-water urn', nameplateA: null, nameplateW: 1500, powerFactor: 1, connection: 'cord-and-plug', continuous: false, motorHp: null, lockedRotorCode: null, notes: '30-cup urn.' },
  { id: '00000000-0000-4000-8000-0000000000d3', circuitId: DEMO_CIRCUITS[1]!.id, name: 'Cooler condensing unit', nameplateA: 9.8, nameplateW: null, powerFactor: 0.8, connection: 'fastened-in-place', continuous: true, motorHp: null, lockedRotorCode: null, notes: 'Hermetic compressor, nameplate RLA 9.8 A, LRA 52 A.' },
  { id: '00000000-0000-4000-8000-0000000000d4', circuitId: DEMO_CIRCUITS[2]!.id, name: 'Air compressor (50 L)', nameplateA: 8.7, nameplateW: null, powerFactor: 0.85, connection: 'cord-and-plug', continuous: false, motorHp: 2, lockedRotorCode: null, notes: 'Direct-on-line induction motor.' },
];

export interface DemoTrace {
  id: string;
  name: string;
  kind: TraceKind;
  siteId: string;
  circuitId: string;
  loadId: string | null;
  nominalVoltageV: number;
  mainsHz: number;
  sampleRateHz: number;
  /** Minutes before the seed time at which the recording started. */
  startedMinutesAgo: number;
  probe: ProbeSettings;
  tags: string[];
  notes: string;
  samples: () => Float32Array;
}

const CLAMP: ProbeSettings = { inputUnit: 'A', sensitivityPerA: 1, loops: 1 };

export const DEMO_TRACES: DemoTrace[] = [
  {
    id: '00000000-0000-4000-8000-0000000000e1',
    name: 'Stand mixer — dough batch',
    kind: 'rms',
    siteId: HALL,
    circuitId: DEMO_CIRCUITS[0]!.id,
    loadId: DEMO_LOADS[0]!.id,
    nominalVoltageV: 120,
    mainsHz: 60,
    sampleRateHz: 20,
    startedMinutesAgo: 180,
    probe: CLAMP,
    tags: ['kitchen', 'motor'],
    notes: 'Logged through a line splitter at the receptacle; two starts, dough hook load peaks mid-batch.',
    samples: () =>
      motorStartRms({ rateHz: 20, durationS: 240, startAtS: 5, stopAtS: 200, runningA: 8.2, startPeakA: 31, tauS: 0.25, ripple: 0.04, surges: [[60, 3.5, 2.5], [120, 4.2, 3], [150, 2.8, 2]], seed: 11 }),
  },
  {
    id: '00000000-0000-4000-8000-0000000000e2',
    name: 'Hot-water urn — heat-up',
    kind: 'rms',
    siteId: HALL,
    circuitId: DEMO_CIRCUITS[0]!.id,
    loadId: DEMO_LOADS[1]!.id,
    nominalVoltageV: 120,
    mainsHz: 60,
    sampleRateHz: 1,
    startedMinutesAgo: 150,
    probe: CLAMP,
    tags: ['kitchen', 'resistive'],
    notes: 'Full urn from cold until the thermostat opened.',
    samples: () => resistiveHeaterRms({ rateHz: 1, durationS: 1500, onAtS: 10, offAtS: 1390, currentA: 12.4, coldRatio: 1.06, warmUpTauS: 4, seed: 12 }),
  },
  {
    id: '00000000-0000-4000-8000-0000000000e3',
    name: 'Walk-in cooler — afternoon',
    kind: 'rms',
    siteId: HALL,
    circuitId: DEMO_CIRCUITS[1]!.id,
    loadId: DEMO_LOADS[2]!.id,
    nominalVoltageV: 120,
    mainsHz: 60,
    sampleRateHz: 2,
    startedMinutesAgo: 600,
    probe: { inputUnit: 'mV', sensitivityPerA: 10, loops: 1 },
    tags: ['cooler', 'compressor'],
    notes: 'Logger on the circuit conductor in the panel (10 mV/A clamp), 0.5 s interval.',
    samples: () => compressorCyclingRms({ rateHz: 2, durationS: 7200, onS: 540, offS: 360, firstStartS: 120, runningA: 9.6, lockedRotorA: 50, startTauS: 0.35, seed: 13 }),
  },
  {
    id: '00000000-0000-4000-8000-0000000000e4',
    name: 'Air compressor start — waveform',
    kind: 'waveform',
    siteId: WORKSHOP,
    circuitId: DEMO_CIRCUITS[2]!.id,
    loadId: DEMO_LOADS[3]!.id,
    nominalVoltageV: 230,
    mainsHz: 50,
    sampleRateHz: 5000,
    startedMinutesAgo: 60,
    probe: CLAMP,
    tags: ['workshop', 'motor', 'waveform'],
    notes: 'Instantaneous current at 5 kHz around a start from empty tank.',
    samples: () =>
      motorStartWaveform({ rateHz: 5000, mainsHz: 50, durationS: 6, startAtS: 0.5, runningRmsA: 8.4, startRmsA: 48, tauS: 0.18, dcOffset: 0.6, noiseA: 0.05, seed: 14 }),
  },
];

/** Raw readings for a trace: the demo generators give amps; scale back through the probe (e.g. mV). */
export function rawReadings(trace: DemoTrace): Float32Array {
  const amps = trace.samples();
  const { inputUnit, sensitivityPerA, loops } = trace.probe;
  if (inputUnit === 'A' && sensitivityPerA === 1 && loops === 1) return amps;
  const out = new Float32Array(amps.length);
  for (let i = 0; i < amps.length; i++) out[i] = amps[i]! * sensitivityPerA * loops;
  return out;
}

/**
 * Stores a demo trace's samples. The trace ingest service provides this; until it is wired in, the
 * demo traces carry metadata only.
 */
export type StoreDemoSamples = (db: Db, trace: DemoTrace, startTime: Date) => Promise<void>;

/** Creates the demo organisation and everything in it (assumes it is absent). */
export async function seedDemo(db: Db, storeSamples?: StoreDemoSamples, now = new Date()): Promise<void> {
  const m = db.models;
  await db.sequelize.transaction(async (transaction) => {
    await m.Organisation.create(DEMO_ORGANISATION, { transaction });
    for (const u of DEMO_USERS) {
      await m.User.create({
        id: u.id,
        organisationId: DEMO_ORGANISATION.id,
        email: u.email,
        name: u.name,
        role: u.role,
        passwordHash: await bcrypt.hash(u.password, 10),
      }, { transaction });
    }
    await m.ApiKey.create({
      id: DEMO_API_KEY.id,
      organisationId: DEMO_ORGANISATION.id,
      name: DEMO_API_KEY.name,
      scopes: DEMO_API_KEY.scopes,
      secretHash: hashSecret(DEMO_API_KEY.secret),
      createdByUserId: DEMO_USERS[0]!.id,
      expiresAt: null,
      revokedAt: null,
      rotatedAt: null,
      lastUsedAt: null,
      lastUsedFrom: null,
    }, { transaction });
    for (const s of DEMO_SITES) await m.Site.create({ ...s, organisationId: DEMO_ORGANISATION.id }, { transaction });
    for (const c of DEMO_CIRCUITS) await m.Circuit.create({ ...c, organisationId: DEMO_ORGANISATION.id, necEdition: 2023 }, { transaction });
    for (const l of DEMO_LOADS) await m.Load.create({ ...l, organisationId: DEMO_ORGANISATION.id }, { transaction });
  });
  for (const t of DEMO_TRACES) {
    const startTime = new Date(Math.floor(now.getTime() / 1000) * 1000 - t.startedMinutesAgo * 60_000);
    await m.Trace.create({
      id: t.id,
      organisationId: DEMO_ORGANISATION.id,
      siteId: t.siteId,
      circuitId: t.circuitId,
      loadId: t.loadId,
      name: t.name,
      kind: t.kind,
      probe: t.probe,
      nominalVoltageV: t.nominalVoltageV,
      mainsHz: t.mainsHz,
      startTime,
      sampleRateHz: t.sampleRateHz,
      tags: t.tags,
      notes: t.notes,
    });
    if (storeSamples) await storeSamples(db, t, startTime);
  }
}

/** Seeds the demo when the database has no organisation yet. Returns whether it seeded. */
export async function seedDemoIfEmpty(db: Db, storeSamples?: StoreDemoSamples): Promise<boolean> {
  if ((await db.models.Organisation.count()) > 0) return false;
  await seedDemo(db, storeSamples);
  return true;
}

/** Removes the demo organisation (cascading to all its rows) and seeds it afresh. Other organisations are kept. */
export async function resetDemo(db: Db, storeSamples?: StoreDemoSamples): Promise<void> {
  await db.models.Organisation.destroy({ where: { id: DEMO_ORGANISATION.id } });
  await seedDemo(db, storeSamples);
}
