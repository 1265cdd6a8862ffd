import { Fragment, useState } from 'react';
import type { MailboxMessage } from '../api/get-mailbox';

const URL_RE = /(https?:\/\/[^\s<>"')]+)/g;

/** Plain text with every address turned into a link (the capture keeps the text part). */
function Linkified({ text }: { text: string }) {
  const parts = text.split(URL_RE);
  return (
    <>
      {parts.map((p, i) =>
        i % 2 === 1 ? (
          <a key={i} href={p} className="break-all">{p}</a>
        ) : (
          <Fragment key={i}>{p}</Fragment>
        ),
      )}
    </>
  );
}

export function MailboxView({ messages }: { messages: MailboxMessage[] }) {
  const [openId, setOpenId] = useState<string | null>(messages[0]?.id ?? null);
  if (messages.length === 0) return <p className="text-ink/70">No mail yet. Messages Cohesia sends appear here within a few seconds.</p>;
  return (
    <ul className="divide-y divide-mist rounded-lg border border-mist bg-white">
      {messages.map((m) => {
        const open = openId === m.id;
        return (
          <li key={m.id} data-testid="mail-item">
            <button
              type="button"
              aria-expanded={open}
              onClick={() => setOpenId(open ? null : m.id)}
              className="flex w-full flex-wrap items-baseline gap-x-4 px-4 py-3 text-left hover:bg-paper"
            >
              <span className="font-medium">{m.subject}</span>
              <span className="text-sm text-ink/70">to {m.to.join(', ')}</span>
              <span className="ml-auto text-xs tabular-nums text-ink/60">{new Date(m.receivedAt).toLocaleString('en-GB')}</span>
            </button>
            {open ? (
              <div className="whitespace-pre-wrap border-t border-mist px-4 py-3 text-sm" data-testid="mail-body">
                <Linkified text={m.text} />
              </div>
            ) : null}
          </li>
        );
      })}
    </ul>
  );
}
