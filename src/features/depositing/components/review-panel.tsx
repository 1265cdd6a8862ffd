import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import type { DraftView } from '../../../../shared/contracts';
import { labRoleCan, type LabRole } from '../../../../shared/lab-roles';
import { Button } from '../../../components/button';
import { FormAlert, TextArea } from '../../../components/form';
import { errorMessage } from '../../../components/query-state';
import { paths } from '../../../app/paths';
import { useSubmitDraft } from '../api/submit-draft';
import { useReturnDraft } from '../api/return-draft';
import { usePublishDraft } from '../api/publish-draft';
import { useCommentOnDraft } from '../api/comment-on-draft';

const kindLabel: Record<string, string> = { comment: 'commented', submitted: 'submitted', returned: 'returned the draft', published: 'published' };

export function ReviewPanel({ slug, draft, role, onWantProblems }: { slug: string; draft: DraftView; role: LabRole | null; onWantProblems: () => void }) {
  const submit = useSubmitDraft(slug, draft.id);
  const ret = useReturnDraft(slug, draft.id);
  const publish = usePublishDraft(slug, draft.id);
  const comment = useCommentOnDraft(slug, draft.id);
  const navigate = useNavigate();
  const [error, setError] = useState<string | null>(null);
  const [note, setNote] = useState('');
  const [changelog, setChangelog] = useState(draft.changelog);
  const canEdit = labRoleCan(role, { dataset: ['edit'] });
  const canReview = labRoleCan(role, { release: ['publish'] });
  const editable = draft.state === 'editing' || draft.state === 'returned';
  const fail = (e: unknown) => setError(errorMessage(e));

  return (
    <div className="flex flex-col gap-4 rounded-lg border border-mist bg-white p-4">
      {error ? <FormAlert>{error}</FormAlert> : null}
      {editable && canEdit ? (
        <div className="flex flex-col gap-2">
          {draft.blockers.length ? (
            <ul className="list-disc pl-5 text-sm text-ink/80">
              {draft.blockers.map((b) => (
                <li key={b}>{b}</li>
              ))}
            </ul>
          ) : (
            <p className="text-sm">Everything is in place. A curator of the lab reviews the draft and publishes it.</p>
          )}
          <div>
            <Button
              onClick={() => {
                setError(null);
                if (!draft.canSubmit) return onWantProblems();
                submit.mutate(undefined, { onError: fail });
              }}
              busy={submit.isPending}
            >
              Submit for review
            </Button>
          </div>
        </div>
      ) : null}
      {draft.state === 'submitted' ? (
        canReview ? (
          <div className="flex flex-col gap-3">
            <p className="text-sm">This draft waits for your review. Publishing makes an immutable release with its own identifier.</p>
            <TextArea label="Release notes (optional)" value={changelog} onChange={(e) => setChangelog(e.target.value)} />
            <div className="flex flex-wrap gap-2">
              <Button
                onClick={() => publish.mutate(changelog, { onSuccess: (r) => navigate(paths.release(r.suffix)), onError: fail })}
                busy={publish.isPending}
              >
                Publish as a release
              </Button>
            </div>
            <TextArea label="Or return it with a comment" value={note} onChange={(e) => setNote(e.target.value)} hint="The depositor gets this by e-mail." />
            <div>
              <Button variant="secondary" disabled={note.trim().length < 5} busy={ret.isPending} onClick={() => ret.mutate(note, { onSuccess: () => setNote(''), onError: fail })}>
                Return for changes
              </Button>
            </div>
          </div>
        ) : (
          <p className="text-sm">Submitted: a curator of the lab reviews it now. You get an e-mail when it is published or returned.</p>
        )
      ) : null}

      <div>
        <h3 className="mb-2 font-serif font-bold">Conversation</h3>
        {draft.comments.length ? (
          <ol className="flex flex-col gap-2 text-sm">
            {draft.comments.map((c) => (
              <li key={c.id} className="rounded border border-mist px-3 py-2">
                <div className="text-xs text-ink/60">
                  {c.author} {kindLabel[c.kind] ?? c.kind} · {new Date(c.createdAt).toLocaleString('en-GB')}
                </div>
                <p className="whitespace-pre-wrap">{c.body}</p>
              </li>
            ))}
          </ol>
        ) : (
          <p className="text-sm text-ink/70">No comments yet.</p>
        )}
        <CommentBox onSend={(body) => comment.mutateAsync(body)} busy={comment.isPending} />
      </div>
    </div>
  );
}

function CommentBox({ onSend, busy }: { onSend: (body: string) => Promise<unknown>; busy: boolean }) {
  const [body, setBody] = useState('');
  const [error, setError] = useState<string | null>(null);
  return (
    <div className="mt-3 flex flex-col gap-2">
      {error ? <FormAlert>{error}</FormAlert> : null}
      <TextArea label="Add a comment" value={body} onChange={(e) => setBody(e.target.value)} />
      <div>
        <Button
          variant="secondary"
          disabled={!body.trim()}
          busy={busy}
          onClick={() => onSend(body).then(() => setBody(''), (e) => setError(errorMessage(e)))}
        >
          Post comment
        </Button>
      </div>
    </div>
  );
}
