import type { OpenApiDoc } from '../api/get-openapi';

const methodTone: Record<string, string> = { get: 'text-reed', post: 'text-dusk', put: 'text-plum', patch: 'text-plum', delete: 'text-[#9a4a1c]' };

/** A readable list of the API's operations, from its OpenAPI description. */
export function ApiReference({ doc }: { doc: OpenApiDoc }) {
  const ops = Object.entries(doc.paths).flatMap(([path, methods]) => Object.entries(methods).map(([method, op]) => ({ path, method, op })));
  return (
    <div className="flex flex-col gap-2">
      <p className="text-sm">
        {ops.length} operations · machine-readable description: <a href="/api/openapi.json">/api/openapi.json</a> (OpenAPI 3.1). Scripts authenticate with{' '}
        <code>Authorization: Bearer coh_…</code> (tokens on your account page).
      </p>
      <ul className="divide-y divide-mist rounded-lg border border-mist bg-white text-sm">
        {ops.map(({ path, method, op }) => (
          <li key={method + path} className="px-3 py-2">
            <details>
              <summary className="flex cursor-pointer flex-wrap items-baseline gap-3">
                <span className={`w-14 font-mono text-xs font-bold uppercase ${methodTone[method] ?? ''}`}>{method}</span>
                <code className="font-mono text-xs">{path}</code>
                <span className="text-ink/80">{op.summary}</span>
              </summary>
              <div className="mt-2 pl-16 text-xs text-ink/80">
                <p>{op.description}</p>
                {op.requestBody ? (
                  <pre className="mt-2 max-h-64 overflow-auto rounded bg-paper p-2">{JSON.stringify(op.requestBody.content['application/json']?.schema, null, 2)}</pre>
                ) : null}
              </div>
            </details>
          </li>
        ))}
      </ul>
    </div>
  );
}
