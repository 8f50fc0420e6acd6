import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { ErrorState } from '../../../components/ui/states';
import { useWhatIfCheck } from '../api/check';
import { emptyLoadDraft, LoadFigureFields, loadFiguresFromDraft } from './load-fields';
import { VerdictPanel } from './verdict';

/**
 * "What if I plug in …?": a hypothetical load by nameplate, checked with the stored ones. Nothing is saved.
 */
export function WhatIfForm({ circuitId }: { circuitId: string }) {
  const whatIf = useWhatIfCheck(circuitId);
  const [draft, setDraft] = useState({ ...emptyLoadDraft, name: 'Extra load' });
  const submit = (e: FormEvent) => {
    e.preventDefault();
    whatIf.mutate([loadFiguresFromDraft(draft)]);
  };
  return (
    <div className="space-y-4">
      <form onSubmit={submit} className="space-y-3" aria-label="What-if check">
        <LoadFigureFields draft={draft} onChange={setDraft} error={whatIf.error} pointerPrefix="/extraLoads/0" />
        {whatIf.isError ? <ErrorState error={whatIf.error} /> : null}
        <div className="flex gap-2">
          <Button type="submit" disabled={whatIf.isPending || !draft.name.trim()}>
            {whatIf.isPending ? 'Checking…' : 'Check with this load'}
          </Button>
          {whatIf.data ? (
            <Button variant="ghost" onClick={() => whatIf.reset()}>
              Clear result
            </Button>
          ) : null}
        </div>
      </form>
      {whatIf.data ? <VerdictPanel check={whatIf.data} title={`What if: ${draft.name || 'extra load'} added`} /> : null}
    </div>
  );
}
