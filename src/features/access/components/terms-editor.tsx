import { useState } from 'react';
import { Button } from '../../../components/button';
import { FormAlert, TextArea } from '../../../components/form';
import { errorMessage } from '../../../components/query-state';
import { useLabTerms, useUpdateLabTerms } from '../api/lab-terms';

/** The lead writes the lab's data-use terms; each save is a new version, requests keep the one they accepted. */
export function TermsEditor({ slug, canEdit }: { slug: string; canEdit: boolean }) {
  const terms = useLabTerms(slug);
  const update = useUpdateLabTerms(slug);
  const [draft, setDraft] = useState<string | null>(null);
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  if (!terms.data) return null;
  const body = draft ?? terms.data.body;
  return (
    <div className="flex flex-col gap-2 rounded-lg border border-mist bg-white p-4">
      {message ? <FormAlert tone={message.tone}>{message.text}</FormAlert> : null}
      <TextArea label={`Data-use terms (version ${terms.data.version})`} value={body} disabled={!canEdit} onChange={(e) => setDraft(e.target.value)} className="min-h-40" />
      <p className="text-xs text-ink/70">Write them with your institution's research-data office; they apply alongside the law that governs your lab.</p>
      {canEdit ? (
        <div>
          <Button
            variant="secondary"
            disabled={draft === null || draft === terms.data.body}
            busy={update.isPending}
            onClick={() =>
              update.mutate(body, {
                onSuccess: (t) => {
                  setDraft(null);
                  setMessage({ tone: 'success', text: `Saved as version ${t.version}.` });
                },
                onError: (e) => setMessage({ tone: 'error', text: errorMessage(e) }),
              })
            }
          >
            Save as a new version
          </Button>
        </div>
      ) : null}
    </div>
  );
}
