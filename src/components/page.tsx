import type { ReactNode } from 'react';

/** A page's heading and body; `wide` for dense working pages, narrow for reading. */
export function Page({ title, lead, actions, wide, children }: { title: string; lead?: ReactNode; actions?: ReactNode; wide?: boolean; children: ReactNode }) {
  return (
    <div className={`mx-auto w-full ${wide ? 'max-w-6xl' : 'max-w-3xl'} px-4 py-8`}>
      <div className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-mist pb-4">
        <div>
          <h1 className="text-2xl font-bold leading-tight sm:text-3xl">{title}</h1>
          {lead ? <p className="mt-2 text-ink/75">{lead}</p> : null}
        </div>
        {actions ? <div className="flex gap-2">{actions}</div> : null}
      </div>
      {children}
    </div>
  );
}

export function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="mb-8">
      <h2 className="mb-3 text-lg font-bold">{title}</h2>
      {children}
    </section>
  );
}
