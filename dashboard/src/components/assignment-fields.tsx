import { useQuery } from '@tanstack/react-query';
import { unwrap } from '@headroom/sdk';
import { sdk } from '../lib/sdk';
import { SelectField } from './ui/field';

export interface Assignment {
  siteId: string;
  circuitId: string;
  loadId: string;
}

export const noAssignment: Assignment = { siteId: '', circuitId: '', loadId: '' };

/**
 * Site → circuit → load pickers for a trace (upload and edit). Each list loads once its parent is chosen;
 * changing a parent clears the choices below it. The query keys match the sites and circuits pages', so
 * the lists are shared in the cache.
 */
export function AssignmentFields({
  value,
  onChange,
  disabled = false,
  mode = 'assign',
}: {
  value: Assignment;
  onChange: (a: Assignment) => void;
  disabled?: boolean;
  /** `assign`: the empty choice means none; `filter`: it means any. */
  mode?: 'assign' | 'filter';
}) {
  const empty = mode === 'filter' ? 'Any' : 'No';
  const sites = useQuery({
    queryKey: ['sites', 'list'],
    queryFn: () => unwrap(sdk.GET('/sites', { params: { query: { limit: 500 } } })),
  });
  const circuits = useQuery({
    queryKey: ['circuits', 'list', { siteId: value.siteId }],
    queryFn: () => unwrap(sdk.GET('/circuits', { params: { query: { siteId: value.siteId, limit: 500 } } })),
    enabled: Boolean(value.siteId),
  });
  const loads = useQuery({
    queryKey: ['loads', 'list', { circuitId: value.circuitId }],
    queryFn: () =>
      unwrap(
        sdk.GET('/circuits/{circuitId}/loads', {
          params: { path: { circuitId: value.circuitId }, query: { limit: 500 } },
        }),
      ),
    enabled: Boolean(value.circuitId),
  });
  return (
    <div className="grid gap-3 sm:grid-cols-3">
      <SelectField
        label="Site"
        value={value.siteId}
        disabled={disabled || sites.isPending}
        onChange={(e) => onChange({ siteId: e.target.value, circuitId: '', loadId: '' })}
      >
        <option value="">{sites.isPending ? 'Loading…' : `${empty} site`}</option>
        {sites.data?.items.map((s) => (
          <option key={s.id} value={s.id}>
            {s.name}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Circuit"
        value={value.circuitId}
        disabled={disabled || !value.siteId}
        onChange={(e) => onChange({ ...value, circuitId: e.target.value, loadId: '' })}
        hint={value.siteId ? undefined : 'Choose a site first'}
      >
        <option value="">{empty} circuit</option>
        {circuits.data?.items.map((c) => (
          <option key={c.id} value={c.id}>
            {c.label} ({c.deviceRatingA} A)
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Load"
        value={value.loadId}
        disabled={disabled || !value.circuitId}
        onChange={(e) => onChange({ ...value, loadId: e.target.value })}
        hint={value.circuitId ? undefined : 'Choose a circuit first'}
      >
        <option value="">{empty} load</option>
        {loads.data?.items.map((l) => (
          <option key={l.id} value={l.id}>
            {l.name}
          </option>
        ))}
      </SelectField>
    </div>
  );
}
