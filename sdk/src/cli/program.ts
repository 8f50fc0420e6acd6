import { Command, CommanderError, Option } from 'commander';
import { createHeadroom, type Headroom } from '../headroom.js';
import { EXIT, isoTime, keyValues, num, reportError, table, UsageError, type CliIo } from './output.js';
import { pushFile, type PushOptions } from './push.js';

interface GlobalOptions {
  url?: string;
  key?: string;
  json?: boolean;
}

const DEFAULT_URL = 'http://localhost:3000';

function connect(options: GlobalOptions, io: CliIo): Headroom {
  const baseUrl = options.url ?? io.env.HEADROOM_URL ?? DEFAULT_URL;
  const token = options.key ?? io.env.HEADROOM_KEY;
  if (!token) throw new UsageError('no API key: set HEADROOM_KEY or pass --key (an admin creates keys in the dashboard or with POST /api/v1/api-keys)');
  return createHeadroom({ baseUrl, token });
}

function timeOption(flag: string, description: string): Option {
  return new Option(flag, `${description} (ISO 8601 or epoch ms)`);
}

/** The `headroom` command tree. Each action returns its output; errors are printed once, in runCli. */
function buildProgram(io: CliIo, signal: AbortSignal): Command {
  const program = new Command('headroom')
    .description('Push current traces to Headroom and read their figures.\nConfigured by HEADROOM_URL and HEADROOM_KEY, or --url and --key.')
    .option('--url <url>', `server origin (default: HEADROOM_URL or ${DEFAULT_URL})`)
    .option('--key <key>', 'API key or session token (default: HEADROOM_KEY)')
    .option('--json', 'print JSON for scripts instead of text')
    .configureOutput({ writeOut: (s) => io.stdout.write(s), writeErr: (s) => io.stderr.write(s) })
    .exitOverride()
    .showHelpAfterError();

  const print = (json: boolean | undefined, value: unknown, text: () => string) => io.stdout.write(json ? `${JSON.stringify(value, null, 2)}\n` : text());

  program
    .command('push')
    .description('Append a CSV export or a raw float32/float64 file to a trace, in batches, with a progress bar; run again with --trace to resume')
    .argument('<file>', 'a .csv (or .txt) export, or .f32 / .f64 little-endian values')
    .option('--trace <id>', 'append to this trace (resumes after its last stored sample)')
    .option('--new', 'create a new trace first (needs --name)')
    .option('--name <name>', 'name of the new trace')
    .addOption(new Option('--kind <kind>', 'kind of the new trace').choices(['rms', 'waveform']).default('rms'))
    .option('--rate <hz>', 'sample rate of uniform data (.f32/.f64), Hz', Number)
    .addOption(timeOption('--start <time>', 'time of the first sample of uniform data, or of t = 0 for seconds-from-start CSV times'))
    .option('--site <id>', 'site of the new trace')
    .option('--circuit <id>', 'circuit of the new trace')
    .option('--load <id>', 'load of the new trace')
    .option('--voltage <V>', 'nominal voltage of the new trace (for energy), V', Number)
    .option('--mains <Hz>', 'mains frequency of the new trace, Hz', Number)
    .addOption(new Option('--unit <unit>', 'unit of the readings (probe input)').choices(['A', 'mA', 'mV']))
    .option('--sensitivity <n>', 'probe: raw units per ampere (e.g. 10 for 10 mV/A)', Number)
    .option('--loops <n>', 'probe: turns through the jaw (10 for a x10 splitter loop)', Number)
    .option('--time-column <names>', 'CSV: time column, or date and time columns joined by a comma ("Date,Time")')
    .option('--current-column <name>', 'CSV: current column')
    .option('--delimiter <char>', 'CSV: field separator (default: found from the header)')
    .addOption(new Option('--time-format <format>', 'CSV: how times are written (default: detected)').choices(['iso', 'epoch-ms', 'epoch-s', 'seconds', 'd/m/y', 'm/d/y']))
    .option('--utc-offset <offset>', 'CSV: zone of times written without one, e.g. +01:00 (default: UTC)')
    .option('--decimal-comma', 'CSV: numbers are written with a decimal comma')
    .option('--missing <tokens>', 'CSV: comma-separated markers of a missing reading, e.g. "?" (such rows are skipped)')
    .option('--batch <n>', 'samples per request (default 50,000 for CSV, 262,144 for binary)', Number)
    .option('--close', 'close the trace when the file is in (runs the full analysis)')
    .option('--no-progress', 'no progress bar')
    .action(async (file: string, options: PushOptions, command: Command) => {
      const globals = command.optsWithGlobals<GlobalOptions & PushOptions>();
      const result = await pushFile(connect(globals, io), file, options, { io, json: Boolean(globals.json), signal });
      print(globals.json, result, () =>
        keyValues([
          ['trace', result.traceId],
          ['sent', `${result.sent.toLocaleString('en-US')} samples in ${result.batches} batch${result.batches === 1 ? '' : 'es'}`],
          ...(result.alreadyStored ? ([['already stored', `${result.alreadyStored.toLocaleString('en-US')} samples (skipped)`]] as [string, string][]) : []),
          ...(result.missing ? ([['missing readings', `${result.missing.toLocaleString('en-US')} rows skipped`]] as [string, string][]) : []),
          ['stored in trace', `${result.sampleCount.toLocaleString('en-US')} samples, ${isoTime(result.firstSampleTime)} to ${isoTime(result.lastSampleTime)}`],
          ['status', result.status],
        ]),
      );
    });

  const traces = program.command('traces').description('List and read traces');
  traces
    .command('list')
    .description('List traces, newest first')
    .option('--site <id>', 'of this site')
    .option('--circuit <id>', 'of this circuit')
    .option('--load <id>', 'of this load')
    .addOption(new Option('--kind <kind>').choices(['rms', 'waveform']))
    .addOption(new Option('--status <status>').choices(['open', 'closed']))
    .option('--search <text>', 'name, tags or notes contain this text')
    .option('--limit <n>', 'at most this many (default 50)', Number, 50)
    .action(async (options: { site?: string; circuit?: string; load?: string; kind?: 'rms' | 'waveform'; status?: 'open' | 'closed'; search?: string; limit: number }, command: Command) => {
      const globals = command.optsWithGlobals<GlobalOptions>();
      const headroom = connect(globals, io);
      const list = await headroom.traces
        .list({ siteId: options.site, circuitId: options.circuit, loadId: options.load, kind: options.kind, status: options.status, q: options.search, sort: '-createdAt', limit: Math.min(options.limit, 500) }, { signal })
        .toArray({ limit: options.limit });
      print(globals.json, list, () =>
        table(
          ['id', 'name', 'kind', 'status', 'samples', 'first sample', 'last sample'],
          list.map((t) => [t.id, t.name, t.kind, t.status, t.sampleCount.toLocaleString('en-US'), isoTime(t.firstSampleTime), isoTime(t.lastSampleTime)]),
        ),
      );
    });
  traces
    .command('get')
    .description('One trace: metadata and the summary of its stored samples')
    .argument('<trace-id>')
    .action(async (traceId: string, _options: unknown, command: Command) => {
      const globals = command.optsWithGlobals<GlobalOptions>();
      const trace = await connect(globals, io).traces.get(traceId, { signal });
      print(globals.json, trace, () =>
        keyValues([
          ['id', trace.id],
          ['name', trace.name],
          ['kind', trace.kind],
          ['status', trace.status],
          ['samples', trace.sampleCount.toLocaleString('en-US')],
          ['first sample', isoTime(trace.firstSampleTime)],
          ['last sample', isoTime(trace.lastSampleTime)],
          ['sample rate', trace.sampleRateHz ? `${num(trace.sampleRateHz)} Hz` : '—'],
        ]),
      );
    });

  program
    .command('stats')
    .description('Statistics of a trace, or of a window of it')
    .argument('<trace-id>')
    .addOption(timeOption('--from <time>', 'window start'))
    .addOption(timeOption('--to <time>', 'window end'))
    .option('--percentiles', 'exact p50/p95/p99 (reads the window\'s samples)')
    .action(async (traceId: string, options: { from?: string; to?: string; percentiles?: boolean }, command: Command) => {
      const globals = command.optsWithGlobals<GlobalOptions>();
      const query = { ...(options.from ? { from: options.from } : {}), ...(options.to ? { to: options.to } : {}), ...(options.percentiles ? { percentiles: 'true' as const } : {}) };
      const stats = await connect(globals, io).traces.stats(traceId, query, { signal });
      print(globals.json, stats, () => statsText(stats));
    });

  program
    .command('events')
    .description('Start-up (inrush) events and surges of a trace')
    .argument('<trace-id>')
    .action(async (traceId: string, _options: unknown, command: Command) => {
      const globals = command.optsWithGlobals<GlobalOptions>();
      const events = await connect(globals, io).traces.events(traceId, {}, { signal });
      print(globals.json, events, () => eventsText(events));
    });

  program
    .command('check')
    .description('The headroom check of a circuit: the verdict, its reasons and the cautions')
    .argument('<circuit-id>')
    .action(async (circuitId: string, _options: unknown, command: Command) => {
      const globals = command.optsWithGlobals<GlobalOptions>();
      const check = await connect(globals, io).checks.get(circuitId, { signal });
      print(globals.json, check, () => {
        const lines = [
          `${check.circuitLabel}: ${check.verdictLabel}`,
          check.summary,
          `headroom ${num(check.headroomA, 1)} A (steady)${check.startHeadroomA === null ? '' : `, ${num(check.startHeadroomA, 1)} A at start-up`}`,
        ];
        if (check.reasons.length) lines.push('', 'reasons:', ...check.reasons.map((r) => `  - ${r.message}${r.citation ? ` (${r.citation.code} ${r.citation.edition} ${r.citation.section})` : ''}`));
        lines.push('', 'cautions:', ...check.cautions.map((c) => `  - ${c.text}`));
        return `${lines.join('\n')}\n`;
      });
    });

  return program;
}

type Stats = Awaited<ReturnType<Headroom['traces']['stats']>>;
type Events = Awaited<ReturnType<Headroom['traces']['events']>>;

/** A number field of an untyped figure object (the API documents statistics and events in prose). */
function field(object: Record<string, unknown> | null | undefined, key: string): number | null {
  const value = object?.[key];
  return typeof value === 'number' ? value : null;
}

function statsText(stats: Stats): string {
  const s = stats.statistics;
  if (!s) return 'no samples in this window\n';
  const a = (key: string, digits = 3) => `${num(field(s, key), digits)} A`;
  const energy = field(s, 'energyKWh');
  return keyValues([
    ['samples', (field(s, 'count') ?? 0).toLocaleString('en-US')],
    ['from', isoTime(field(s, 'firstAt'))],
    ['to', isoTime(field(s, 'lastAt'))],
    ['min', `${a('minA')} at ${isoTime(field(s, 'minAt'))}`],
    ['max', `${a('maxA')} at ${isoTime(field(s, 'maxAt'))}`],
    ['mean', a('meanA')],
    ['time-weighted mean', a('timeWeightedMeanA')],
    ['RMS', a('rmsA')],
    ['thermal equivalent', a('thermalEquivalentA')],
    ['p50 / p95 / p99', field(s, 'p50A') === null ? '— (add --percentiles)' : `${num(field(s, 'p50A'))} / ${num(field(s, 'p95A'))} / ${num(field(s, 'p99A'))} A`],
    ['charge', `${num(field(s, 'chargeAh'))} Ah`],
    ['energy', energy === null ? '— (the trace has no nominal voltage)' : `${num(energy)} kWh`],
  ]);
}

function eventsText(events: Events): string {
  const inrush = events.inrushEvents;
  const lines = [`${inrush.length} start-up event${inrush.length === 1 ? '' : 's'}, ${events.surges.length} surge${events.surges.length === 1 ? '' : 's'}`];
  if (inrush.length) {
    const rows = inrush.map((e) => [isoTime(field(e, 'onsetAt')), num(field(e, 'peakA'), 2), num(field(e, 'steadyA'), 2), num(field(e, 'peakToSteadyRatio'), 2), num(field(e, 'settleTimeS'), 3), num(field(e, 'i2tA2s'), 1)]);
    lines.push(table(['onset', 'peak A', 'steady A', 'peak/steady', 'settle s', 'I²t A²s'], rows).trimEnd());
  }
  if (events.surges.length) {
    const rows = events.surges.map((e) => [isoTime(field(e, 'startAt')), num(field(e, 'peakA'), 2), num(field(e, 'durationS'), 3)]);
    lines.push(table(['start', 'peak A', 'duration s'], rows).trimEnd());
  }
  return `${lines.join('\n')}\n`;
}

/**
 * Runs the CLI on these arguments and returns the exit code (never calls process.exit, so tests run
 * it in-process). Ctrl-C aborts the request in flight; an interrupted push says how to resume.
 */
export async function runCli(argv: string[], io: CliIo, signal: AbortSignal = new AbortController().signal): Promise<number> {
  const program = buildProgram(io, signal);
  const json = argv.includes('--json');
  try {
    await program.parseAsync(argv, { from: 'user' });
    return EXIT.ok;
  } catch (error) {
    if (error instanceof CommanderError) {
      return error.exitCode === 0 ? EXIT.ok : EXIT.usage;
    }
    return reportError(io, error, json);
  }
}
