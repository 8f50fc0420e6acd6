import { useState } from 'react';
import { Link, useSearchParams } from 'react-router';
import { AssignmentFields } from '../../components/assignment-fields';
import { Button, buttonClass } from '../../components/ui/button';
import { inputClass, SelectField, TextField } from '../../components/ui/field';
import { PageHeader } from '../../components/ui/page-header';
import { EmptyState, ErrorState, LoadingState } from '../../components/ui/states';
import { useTraces, type TraceListQuery, type TraceSort } from '../../features/traces/api/traces';
import { TracesTable } from '../../features/traces/components/traces-table';
import { paths } from '../../lib/paths';
import { useAbilities } from '../../lib/session';

const PAGE_SIZE = 25;
const FILTER_KEYS = [
  'siteId',
  'circuitId',
  'loadId',
  'kind',
  'status',
  'createdFrom',
  'createdTo',
  'q',
  'sort',
] as const;

/** A calendar day (yyyy-mm-dd, the user's zone) as the epoch ms of its start, or of its end. */
const dayStart = (day: string) => new Date(`${day}T00:00:00`).getTime();
const dayEnd = (day: string) => new Date(`${day}T23:59:59.999`).getTime();

export default function TracesPage() {
  const [params, setParams] = useSearchParams();
  const { canEdit } = useAbilities();
  // Cursors of the pages before this one, so "Previous" can go back (the API pages forward only).
  const [previous, setPrevious] = useState<string[]>([]);
  const [search, setSearch] = useState(params.get('q') ?? '');
  const get = (k: (typeof FILTER_KEYS)[number]) => params.get(k) ?? '';
  const cursor = params.get('cursor') ?? '';
  const sort = (get('sort') || '-createdAt') as TraceSort;

  const query: TraceListQuery = {
    limit: PAGE_SIZE,
    sort,
    ...(cursor ? { cursor } : {}),
    ...(get('siteId') ? { siteId: get('siteId') } : {}),
    ...(get('circuitId') ? { circuitId: get('circuitId') } : {}),
    ...(get('loadId') ? { loadId: get('loadId') } : {}),
    ...(get('kind') ? { kind: get('kind') as 'rms' | 'waveform' } : {}),
    ...(get('status') ? { status: get('status') as 'open' | 'closed' } : {}),
    ...(get('createdFrom') ? { createdFrom: dayStart(get('createdFrom')) } : {}),
    ...(get('createdTo') ? { createdTo: dayEnd(get('createdTo')) } : {}),
    ...(get('q') ? { q: get('q') } : {}),
  };
  const traces = useTraces(query);

  /** Changing a filter or the order starts again at the first page. */
  const setFilters = (changes: Partial<Record<(typeof FILTER_KEYS)[number], string>>) => {
    setPrevious([]);
    setParams((prev) => {
      const p = new URLSearchParams(prev);
      p.delete('cursor');
      for (const [k, v] of Object.entries(changes)) {
        if (v) p.set(k, v);
        else p.delete(k);
      }
      return p;
    });
  };
  const goTo = (next: string | null, stack: string[]) => {
    setPrevious(stack);
    setParams((prev) => {
      const p = new URLSearchParams(prev);
      if (next) p.set('cursor', next);
      else p.delete('cursor');
      return p;
    });
  };

  const filtered = FILTER_KEYS.some((k) => k !== 'sort' && get(k));
  const page = traces.data;
  const first = previous.length * PAGE_SIZE + 1;

  return (
    <section aria-labelledby="traces-title" className="space-y-5">
      <PageHeader
        title="Traces"
        titleId="traces-title"
        subtitle="Recordings of current, from loggers, meters, devices and uploads."
        actions={
          canEdit ? (
            <Link to={paths.upload.href()} className={buttonClass('primary')}>
              Upload a CSV
            </Link>
          ) : null
        }
      />

      <form
        role="search"
        aria-label="Filter traces"
        className="space-y-3 rounded-xl border border-ink-100 bg-white p-4 shadow-sm"
        onSubmit={(e) => {
          e.preventDefault();
          setFilters({ q: search.trim() });
        }}
      >
        <div className="grid gap-3 md:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_minmax(0,1fr)]">
          <div className="space-y-1">
            <label htmlFor="trace-search" className="block text-sm font-medium text-ink-900">
              Search
            </label>
            <div className="flex gap-2">
              <input
                id="trace-search"
                type="search"
                className={inputClass}
                placeholder="Name or notes"
                value={search}
                onChange={(e) => setSearch(e.target.value)}
              />
              <Button type="submit" variant="secondary">
                Search
              </Button>
            </div>
          </div>
          <SelectField label="Kind" value={get('kind')} onChange={(e) => setFilters({ kind: e.target.value })}>
            <option value="">Any kind</option>
            <option value="rms">RMS readings</option>
            <option value="waveform">Waveform</option>
          </SelectField>
          <SelectField label="Status" value={get('status')} onChange={(e) => setFilters({ status: e.target.value })}>
            <option value="">Any status</option>
            <option value="open">Open</option>
            <option value="closed">Closed</option>
          </SelectField>
        </div>
        <AssignmentFields
          mode="filter"
          value={{ siteId: get('siteId'), circuitId: get('circuitId'), loadId: get('loadId') }}
          onChange={(a) => setFilters({ siteId: a.siteId, circuitId: a.circuitId, loadId: a.loadId })}
        />
        <div className="flex flex-wrap items-end gap-3">
          <TextField
            label="Added from"
            type="date"
            className="w-44"
            value={get('createdFrom')}
            onChange={(e) => setFilters({ createdFrom: e.target.value })}
          />
          <TextField
            label="Added until"
            type="date"
            className="w-44"
            value={get('createdTo')}
            onChange={(e) => setFilters({ createdTo: e.target.value })}
          />
          {filtered ? (
            <Button
              variant="ghost"
              onClick={() => {
                setSearch('');
                setFilters(Object.fromEntries(FILTER_KEYS.filter((k) => k !== 'sort').map((k) => [k, ''])));
              }}
            >
              Clear filters
            </Button>
          ) : null}
        </div>
      </form>

      {traces.isPending ? (
        <LoadingState label="Loading traces…" />
      ) : traces.isError ? (
        <ErrorState error={traces.error} onRetry={() => void traces.refetch()} />
      ) : page && page.items.length === 0 ? (
        <EmptyState title={filtered ? 'No trace matches these filters' : 'No traces yet'}>
          {filtered
            ? 'Widen the filters or clear them.'
            : canEdit
              ? 'Upload a CSV export, or let a device post samples with an API key.'
              : 'Traces appear here once they are recorded.'}
        </EmptyState>
      ) : page ? (
        <div className="space-y-3">
          <TracesTable traces={page.items} sort={sort} onSort={(s) => setFilters({ sort: s })} />
          <nav aria-label="Pages" className="flex flex-wrap items-center justify-between gap-3 text-sm">
            <p role="status" aria-live="polite" className="text-ink-700">
              {first}–{first + page.items.length - 1} of {page.total} trace{page.total === 1 ? '' : 's'}
              {traces.isPlaceholderData ? ' · loading…' : ''}
            </p>
            <div className="flex gap-2">
              <Button
                variant="secondary"
                disabled={!cursor}
                onClick={() => goTo(previous[previous.length - 1] || null, previous.slice(0, -1))}
              >
                ← Previous
              </Button>
              <Button
                variant="secondary"
                disabled={!page.nextCursor}
                onClick={() => page.nextCursor && goTo(page.nextCursor, [...previous, cursor])}
              >
                Next →
              </Button>
            </div>
          </nav>
        </div>
      ) : null}
    </section>
  );
}
