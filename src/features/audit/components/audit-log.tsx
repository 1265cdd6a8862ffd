import { useState, type FormEvent } from 'react';
import type { InfiniteData, UseInfiniteQueryResult } from '@tanstack/react-query';
import type { AuditEventView, AuditPage } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { FormAlert, SelectField, TextField } from '../../../components/form';
import { Loading, errorMessage } from '../../../components/query-state';
import { ApiRequestError } from '../../../lib/api-client';
import { emptyAuditFilters, type AuditFilters } from '../api/audit-filters';

const TARGET_TYPES = [
  ['', 'Any target'],
  ['lab', 'Lab'],
  ['member', 'Member'],
  ['invitation', 'Invitation'],
  ['access_request', 'Access request'],
  ['release', 'Release'],
  ['dataset', 'Dataset'],
  ['draft', 'Draft'],
] as const;

/** "access_request.approved" → "Access request approved". */
export function actionLabel(action: string): string {
  const text = action.replace(/[._]+/g, ' ').trim();
  return text.charAt(0).toUpperCase() + text.slice(1);
}

const time = (iso: string) => new Date(iso).toISOString().replace('T', ' ').slice(0, 19) + ' UTC';

/** Filters, the table of events (newest first), older pages on demand, and the CSV export of the same filters. */
export function AuditLog({ query, filters, onFilters, exportUrl, showLab = false }: {
  query: UseInfiniteQueryResult<InfiniteData<AuditPage>>;
  filters: AuditFilters;
  onFilters: (f: AuditFilters) => void;
  exportUrl: string;
  showLab?: boolean;
}) {
  const [draft, setDraft] = useState(filters);
  const actions = query.data?.pages[0]?.actions ?? [];
  const events = query.data?.pages.flatMap((p) => p.events) ?? [];
  const set = (k: keyof AuditFilters) => (e: { target: { value: string } }) => setDraft({ ...draft, [k]: e.target.value });
  const submit = (e: FormEvent) => {
    e.preventDefault();
    onFilters(draft);
  };
  const fieldErrors = query.error instanceof ApiRequestError ? query.error.fields ?? {} : {};
  return (
    <div>
      <form onSubmit={submit} className="mb-6 grid gap-3 rounded-md border border-mist bg-white/60 p-4 sm:grid-cols-2 lg:grid-cols-4" aria-label="Filter the audit log">
        <SelectField label="Action" value={draft.action} onChange={set('action')}>
          <option value="">Any action</option>
          {actions.map((a) => (
            <option key={a} value={a}>{actionLabel(a)}</option>
          ))}
        </SelectField>
        <TextField label="Actor" placeholder="Name or e-mail" value={draft.actor} onChange={set('actor')} />
        <SelectField label="Target type" value={draft.targetType} onChange={set('targetType')} error={fieldErrors.targetType}>
          {TARGET_TYPES.map(([v, l]) => (
            <option key={v} value={v}>{l}</option>
          ))}
        </SelectField>
        <TextField label="Target id" value={draft.targetId} onChange={set('targetId')} />
        <TextField label="From (UTC day)" type="date" value={draft.from} onChange={set('from')} error={fieldErrors.from} />
        <TextField label="To (UTC day)" type="date" value={draft.to} onChange={set('to')} error={fieldErrors.to} />
        <div className="flex items-end gap-2 lg:col-span-2">
          <Button type="submit">Apply filters</Button>
          <Button
            type="button"
            variant="secondary"
            onClick={() => {
              setDraft(emptyAuditFilters);
              onFilters(emptyAuditFilters);
            }}
          >
            Clear
          </Button>
          <a className="ml-auto text-sm font-medium text-dusk underline" href={exportUrl} download>
            Export these events as CSV
          </a>
        </div>
      </form>
      {query.isPending ? <Loading label="Loading the audit log…" /> : null}
      {query.isError ? <FormAlert>{errorMessage(query.error)}</FormAlert> : null}
      {query.isSuccess && events.length === 0 ? <p className="py-6 text-sm text-ink/70">No events match these filters.</p> : null}
      {events.length ? (
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-sm tabular-nums">
            <thead>
              <tr className="border-b border-mist text-left">
                <th scope="col" className="py-2 pr-4 font-semibold">Time</th>
                <th scope="col" className="py-2 pr-4 font-semibold">Action</th>
                <th scope="col" className="py-2 pr-4 font-semibold">Actor</th>
                {showLab ? <th scope="col" className="py-2 pr-4 font-semibold">Lab</th> : null}
                <th scope="col" className="py-2 pr-4 font-semibold">Target</th>
                <th scope="col" className="py-2 pr-4 font-semibold">Change</th>
              </tr>
            </thead>
            <tbody>
              {events.map((e) => (
                <EventRow key={e.id} event={e} showLab={showLab} />
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      {query.hasNextPage ? (
        <p className="mt-4">
          <Button variant="secondary" busy={query.isFetchingNextPage} onClick={() => void query.fetchNextPage()}>
            Load older events
          </Button>
        </p>
      ) : null}
    </div>
  );
}

function EventRow({ event: e, showLab }: { event: AuditEventView; showLab: boolean }) {
  return (
    <tr className="border-b border-mist/70 align-top">
      <td className="whitespace-nowrap py-2 pr-4">{time(e.at)}</td>
      <td className="py-2 pr-4">{actionLabel(e.action)}</td>
      <td className="py-2 pr-4">{e.actor ? <span title={e.actor.email}>{e.actor.name}</span> : <span className="text-ink/70">Cohesia (automatic)</span>}</td>
      {showLab ? <td className="py-2 pr-4">{e.lab?.name ?? '—'}</td> : null}
      <td className="py-2 pr-4">
        {actionLabel(e.targetType)} <code className="break-all text-xs text-ink/70">{e.targetId}</code>
        {typeof e.detail?.member === 'string' ? <span className="block text-ink/80">{e.detail.member}</span> : null}
        {e.targetType === 'lab' && e.lab ? <span className="block text-ink/80">{e.lab.name}</span> : null}
      </td>
      <td className="py-2 pr-4">{e.fromState || e.toState ? `${e.fromState ?? '—'} → ${e.toState ?? '—'}` : '—'}</td>
    </tr>
  );
}
