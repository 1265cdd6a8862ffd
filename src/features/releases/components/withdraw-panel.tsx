import { useState } from 'react';
import { Button } from '../../../components/button';
import { FormAlert, TextArea } from '../../../components/form';
import { errorMessage } from '../../../components/query-state';
import { useWithdrawRelease } from '../api/withdraw-release';

/** For the lab lead and platform admins: withdraw a release, leaving a tombstone that keeps its citation. */
export function WithdrawPanel({ labSlug, suffix }: { labSlug: string; suffix: string }) {
  const [open, setOpen] = useState(false);
  const [reason, setReason] = useState('');
  const withdraw = useWithdrawRelease(labSlug, suffix);
  if (!open) {
    return (
      <Button variant="danger" onClick={() => setOpen(true)}>Withdraw this release…</Button>
    );
  }
  return (
    <div className="flex flex-col gap-2 rounded-lg border border-ember bg-white p-4">
      {withdraw.isError ? <FormAlert>{errorMessage(withdraw.error)}</FormAlert> : null}
      <p className="text-sm">Withdrawing cannot be undone. The page then shows only the citation and your reason; the identifier keeps resolving.</p>
      <TextArea label="Reason readers will see" value={reason} onChange={(e) => setReason(e.target.value)} />
      <div className="flex gap-2">
        <Button variant="danger" disabled={reason.trim().length < 10} busy={withdraw.isPending} onClick={() => withdraw.mutate(reason)}>Withdraw</Button>
        <Button variant="secondary" onClick={() => setOpen(false)}>Cancel</Button>
      </div>
    </div>
  );
}
