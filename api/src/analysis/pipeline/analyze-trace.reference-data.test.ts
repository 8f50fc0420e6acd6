/**
 * Real data: the UCI "Individual household electric power consumption" recording (CC BY 4.0,
 * Hébrail & Bérard, UCI dataset 235) kept in ../shared/reference-data/ beside the repository.
 * The check figures come from that folder's README (computed there with numpy); this test parses the
 * file itself (`;`-separated, d/m/yyyy dates, '?' for a missing reading) and runs the engine on the
 * Global_intensity column (ampere, one-minute averages).
 */
/* eslint-disable no-restricted-imports -- the test reads the shared reference recording from disk */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
/* eslint-enable no-restricted-imports */
import { describe, expect, it } from 'vitest';
import { computeStatistics } from '../stats/statistics.js';
import { explicitTimeAxis } from '../time/time-axis.js';
import { analyzeTrace } from './analyze-trace.js';

const repositoryRoot = resolve(dirname(fileURLToPath(import.meta.url)), '../../../..');
const recording = resolve(
  repositoryRoot,
  '../shared/reference-data/uci-household-power/household_power_consumption_2006-12-16_2007-01-19.txt',
);
const present = existsSync(recording);
if (!present) console.warn(`reference recording not found at ${recording}: the real-data checks are skipped`);

/** Minutes as seconds since 1970 for a d/m/yyyy date and hh:mm:ss time (house local time, no zone). */
function secondsOf(date: string, time: string): number {
  const [d, m, y] = date.split('/').map(Number);
  const [hh, mm, ss] = time.split(':').map(Number);
  return Date.UTC(y!, m! - 1, d!, hh!, mm!, ss!) / 1000;
}

function isoMinute(seconds: number): string {
  return new Date(seconds * 1000).toISOString().slice(0, 16).replace('T', ' ');
}

/** Global_intensity readings with a value, and their times; missing readings ('?') are left out. */
function readGlobalIntensity(): { t: Float64Array; a: Float64Array; rows: number } {
  const lines = readFileSync(recording, 'utf8').split('\r\n');
  expect(lines[0]!.split(';')[5]).toBe('Global_intensity');
  const t: number[] = [];
  const a: number[] = [];
  let rows = 0;
  for (const line of lines.slice(1)) {
    if (line === '') continue;
    rows++;
    const fields = line.split(';');
    if (fields[5] === '?') continue;
    t.push(secondsOf(fields[0]!, fields[1]!));
    a.push(Number(fields[5]));
  }
  return { t: Float64Array.from(t), a: Float64Array.from(a), rows };
}

describe.skipIf(!present)('UCI household recording (../shared/reference-data)', () => {
  const { t, a, rows } = present ? readGlobalIntensity() : { t: new Float64Array(0), a: new Float64Array(0), rows: 0 };

  it('reproduces the README figures for Global_intensity', () => {
    // source: shared/reference-data/README.md, section 1 "Check figures" (numpy), rounded as printed there
    expect(rows).toBe(48424);
    const result = analyzeTrace({ kind: 'rms', samples: a, timestampsS: t });
    const s = result.statistics;
    expect(s.count).toBe(48419); // readings with a value; the 5 missing ones are not counted
    expect(isoMinute(s.firstTimeS)).toBe('2006-12-16 17:24');
    expect(isoMinute(s.lastTimeS)).toBe('2007-01-19 08:27');
    expect(s.minA).toBe(0.8);
    expect(s.maxA).toBe(40.4);
    expect(isoMinute(s.maxTimeS)).toBe('2007-01-13 22:47');
    expect(Math.abs(s.meanA - 7.1481)).toBeLessThanOrEqual(0.00005);
    expect(Math.abs(s.rmsA - 9.1451)).toBeLessThanOrEqual(0.00005);
    // p50 / p95 / p99 with numpy's default (linear, type 7) — the same definition as ours
    expect(Math.abs(s.p50A! - 6.0)).toBeLessThanOrEqual(0.0005);
    expect(Math.abs(s.p95A! - 17.6)).toBeLessThanOrEqual(0.0005);
    expect(Math.abs(s.p99A! - 25.0)).toBeLessThanOrEqual(0.0005);
  });

  it('turns the missing readings into gaps by the gap rule, never integrating across them', () => {
    // source: README lists the missing readings: 21/12/2006 11:23 and 11:24, 30/12/2006 10:08 and 10:09, 14/1/2007 18:36
    const axis = explicitTimeAxis(t);
    const byDefault = computeStatistics(axis, a);
    // Default gap factor 2.5 × the 60 s spacing: the two 3-minute holes are gaps, the 2-minute one is bridged.
    expect(byDefault.gaps.thresholdS).toBe(150);
    expect(byDefault.gaps.listed.map((g) => [isoMinute(g.startS), isoMinute(g.endS)])).toEqual([
      ['2006-12-21 11:22', '2006-12-21 11:25'],
      ['2006-12-30 10:07', '2006-12-30 10:10'],
    ]);
    const strict = computeStatistics(axis, a, { gapThresholdS: 90 });
    expect(strict.gaps.count).toBe(3);
    expect(isoMinute(strict.gaps.listed[2]!.startS)).toBe('2007-01-14 18:35');
    expect(strict.coveredTimeS).toBe(strict.durationS - 8 * 60);
    // With evenly spaced minutes the trapezoid mean differs from the plain mean only at the ends and
    // around the holes (derived): well within 0.01 %.
    expect(Math.abs(byDefault.timeWeightedMeanA! / byDefault.meanA - 1)).toBeLessThan(1e-4);
  });

  it('finds the switch-on events and places the largest surge at the recording maximum', () => {
    const result = analyzeTrace({ kind: 'rms', samples: a, timestampsS: t }, { nominalVoltageV: 230 });
    const { onThresholdA, offThresholdA } = result.params.events;
    // Every event starts where the current first rises above the on-threshold after having been at or
    // below the off-threshold: an independent scan straight from the readings must find the same times.
    let off = !(a[0]! > onThresholdA);
    const switchOnTimes: number[] = [];
    for (let i = 0; i < a.length; i++) {
      if (off && a[i]! > onThresholdA) {
        switchOnTimes.push(t[i]!);
        off = false;
      } else if (!off && a[i]! <= offThresholdA) off = true;
    }
    expect(result.inrushEvents.map((e) => e.onsetTimeS)).toEqual(switchOnTimes);
    expect(switchOnTimes.length).toBeGreaterThan(100);
    // source: README — the maximum, 40.4 A, is at 2007-01-13 22:47; it is a surge while running there.
    const largest = [...result.surges].sort((x, y) => y.peakA - x.peakA)[0]!;
    expect(largest.peakA).toBe(40.4);
    expect(isoMinute(largest.peakTimeS)).toBe('2007-01-13 22:47');
    expect(result.eventsTruncated).toBe(false);
  });
});
