import { useState } from 'react';
import { Badge } from '../../../components/badge';
import { Button } from '../../../components/button';
import { FormAlert, TextField } from '../../../components/form';
import { errorMessage } from '../../../components/query-state';
import { useApiTokens, useCreateApiToken, useRevokeApiToken } from '../api/api-tokens';

/** Tokens for scripts: created here, shown once, revoked here. */
export function ApiTokens() {
  const tokens = useApiTokens();
  const create = useCreateApiToken();
  const revoke = useRevokeApiToken();
  const [name, setName] = useState('');
  const [deposit, setDeposit] = useState(false);
  const [fresh, setFresh] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  return (
    <div className="flex flex-col gap-3">
      {fresh ? (
        <FormAlert tone="success">
          Copy this token now; it is not shown again:
          <code className="mt-1 block break-all rounded bg-paper p-2 font-mono text-xs" data-testid="new-token">{fresh}</code>
        </FormAlert>
      ) : null}
      {error ? <FormAlert>{error}</FormAlert> : null}
      <div className="flex flex-wrap items-end gap-3 rounded-lg border border-mist bg-white p-3">
        <div className="min-w-64 flex-1">
          <TextField label="Token name" value={name} onChange={(e) => setName(e.target.value)} hint="Name it after the script that uses it." />
        </div>
        <label className="flex items-center gap-2 pb-2 text-sm">
          <input type="checkbox" checked={deposit} onChange={(e) => setDeposit(e.target.checked)} /> may also deposit (create drafts, upload, submit, publish)
        </label>
        <Button
          busy={create.isPending}
          onClick={() => {
            setError(null);
            create.mutate(
              { name, scopes: deposit ? ['read', 'deposit'] : ['read'] },
              { onSuccess: (t) => { setFresh(t.token); setName(''); }, onError: (e) => setError(errorMessage(e)) },
            );
          }}
        >
          Create token
        </Button>
      </div>
      {tokens.data?.length ? (
        <ul className="divide-y divide-mist rounded-lg border border-mist bg-white text-sm">
          {tokens.data.map((t) => (
            <li key={t.id} className="flex flex-wrap items-center gap-3 px-3 py-2">
              <span className="font-medium">{t.name}</span>
              <code className="font-mono text-xs text-ink/70">{t.prefix}…</code>
              {t.scopes.map((s) => <Badge key={s} icon={s === 'deposit' ? '↥' : '◎'}>{s}</Badge>)}
              <span className="text-xs text-ink/60">{t.lastUsedAt ? `last used ${t.lastUsedAt.slice(0, 10)}` : 'never used'}</span>
              {t.revokedAt ? <Badge tone="ember" icon="⊘">Revoked</Badge> : <Button variant="quiet" className="ml-auto" onClick={() => revoke.mutate(t.id)}>Revoke</Button>}
            </li>
          ))}
        </ul>
      ) : null}
      <p className="text-xs text-ink/70">Send it as <code>Authorization: Bearer …</code>. The API is described at <a href="/api/openapi.json">/api/openapi.json</a>.</p>
    </div>
  );
}
