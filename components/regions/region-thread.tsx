'use client';

// A region's thread: comments in Markdown (rendered safely, with maths and mentions), replies under the comment
// they answer, one's own comments editable (marked "edited") and deletable. The thread polls, so comments others
// write appear without a reload. A refused comment (too many at once) stays in its box with the server's message.
import { useState } from 'react';
import useSWR, { useSWRConfig } from 'swr';
import { type ApiError, messageOf, sendJson } from '@/lib/api/client';
import { type Actor, mayComment, mayDeleteComment, mayEditComment } from '@/lib/regions/rules';
import type { CommentView } from '@/lib/regions/shapes';
import { Button } from '../button';
import { formatDateTime } from '../format';
import { MarkdownView } from '../markdown-view';
import { Notice } from '../notice';
import { CommentComposer, type MentionCandidate } from './comment-composer';
import { regionsUrl } from './use-regions-workspace';

/** How often an open thread asks for new comments. */
const POLL_MS = 3000;

interface ThreadProps {
  studyId: number;
  regionId: number;
  actor: Actor;
  members: readonly MentionCandidate[];
}

export function RegionThread({ studyId, regionId, actor, members }: ThreadProps) {
  const url = `/api/studies/${studyId}/regions/${regionId}/comments`;
  const { data, error, mutate } = useSWR<{ comments: CommentView[] }, ApiError>(url, { refreshInterval: POLL_MS });
  const { mutate: refreshList } = useSWRConfig();
  // A change of the thread changes the region's comment count in the lists too.
  const changed = () => Promise.all([mutate(), refreshList(regionsUrl(studyId))]);
  const comments = data?.comments ?? [];
  const repliesOf = (id: number | null) => comments.filter((c) => (id === null ? c.replyToId === null || !comments.some((p) => p.id === c.replyToId) : c.replyToId === id));

  const renderComment = (comment: CommentView, depth: number) => (
    <li key={comment.id} className={depth > 0 ? 'ml-4 border-l-2 border-accent-soft pl-3' : ''}>
      <CommentItem comment={comment} url={url} actor={actor} members={members} onChanged={changed} />
      {repliesOf(comment.id).length > 0 && <ul className="mt-2 space-y-2">{repliesOf(comment.id).map((reply) => renderComment(reply, Math.min(depth + 1, 3)))}</ul>}
    </li>
  );

  return (
    <div className="space-y-3" data-testid="region-thread">
      {error && <Notice tone="error">{error.message}</Notice>}
      <ul className="space-y-3">{repliesOf(null).map((comment) => renderComment(comment, 0))}</ul>
      {mayComment(actor) && <NewComment url={url} members={members} onPosted={changed} label="Add a comment" />}
    </div>
  );
}

function NewComment({ url, members, onPosted, label, replyToId, onDone }: { url: string; members: readonly MentionCandidate[]; onPosted: () => void; label: string; replyToId?: number; onDone?: () => void }) {
  const [body, setBody] = useState('');
  const [state, setState] = useState<{ pending: boolean; error: string | null }>({ pending: false, error: null });
  async function post() {
    if (!body.trim() || state.pending) return;
    setState({ pending: true, error: null });
    try {
      await sendJson('POST', url, { body, replyToId: replyToId ?? null });
      setBody('');
      setState({ pending: false, error: null });
      onPosted();
      onDone?.();
    } catch (failure) {
      // The text stays in the box: nothing is lost when the server refuses it.
      setState({ pending: false, error: `${messageOf(failure)} Your comment was not posted; it is still in the box.` });
    }
  }
  return (
    <div className="space-y-2">
      <CommentComposer value={body} onChange={setBody} members={members} label={label} onSubmit={post} rows={replyToId ? 2 : 3} />
      {state.error && <Notice tone="error">{state.error}</Notice>}
      <div className="flex gap-2">
        <Button size="sm" variant="primary" onClick={post} disabled={state.pending || !body.trim()}>
          {state.pending ? 'Posting…' : replyToId ? 'Post reply' : 'Post comment'}
        </Button>
        {onDone && (
          <Button size="sm" variant="ghost" onClick={onDone}>
            Cancel
          </Button>
        )}
      </div>
    </div>
  );
}

function CommentItem({ comment, url, actor, members, onChanged }: { comment: CommentView; url: string; actor: Actor; members: readonly MentionCandidate[]; onChanged: () => void }) {
  const [mode, setMode] = useState<'read' | 'edit' | 'reply'>('read');
  const [draft, setDraft] = useState(comment.body);
  const [error, setError] = useState<string | null>(null);
  const authorId = comment.author?.id ?? null;
  async function change(method: 'PATCH' | 'DELETE') {
    setError(null);
    try {
      await sendJson(method, `${url}/${comment.id}`, method === 'PATCH' ? { body: draft } : undefined);
      setMode('read');
      onChanged();
    } catch (failure) {
      setError(messageOf(failure));
    }
  }
  return (
    <article className="space-y-1 rounded-md bg-paper-sunk/60 p-2" data-testid="comment">
      <p className="text-xs text-ink-soft">
        <span className="font-medium text-ink">{comment.author?.name ?? 'A former member'}</span> · {formatDateTime(comment.createdAt)}
        {comment.editedAt && <span title={`Edited ${formatDateTime(comment.editedAt)}`}> · edited</span>}
      </p>
      {comment.deleted ? (
        <p className="text-sm italic text-ink-faint">This comment was deleted.</p>
      ) : mode === 'edit' ? (
        <div className="space-y-2">
          <CommentComposer value={draft} onChange={setDraft} members={members} label="Edit your comment" onSubmit={() => change('PATCH')} />
          <div className="flex gap-2">
            <Button size="sm" variant="primary" onClick={() => change('PATCH')} disabled={!draft.trim()}>
              Save
            </Button>
            <Button size="sm" variant="ghost" onClick={() => setMode('read')}>
              Cancel
            </Button>
          </div>
        </div>
      ) : (
        <MarkdownView source={comment.body} />
      )}
      {error && <Notice tone="error">{error}</Notice>}
      {!comment.deleted && mode === 'read' && (
        <div className="flex gap-1">
          {mayComment(actor) && (
            <Button size="sm" variant="ghost" onClick={() => setMode('reply')}>
              Reply
            </Button>
          )}
          {mayEditComment(actor, authorId) && (
            <Button size="sm" variant="ghost" onClick={() => (setDraft(comment.body), setMode('edit'))}>
              Edit
            </Button>
          )}
          {mayDeleteComment(actor, authorId) && (
            <Button size="sm" variant="ghost" onClick={() => change('DELETE')}>
              Delete
            </Button>
          )}
        </div>
      )}
      {mode === 'reply' && <NewComment url={url} members={members} onPosted={onChanged} label={`Reply to ${comment.author?.name ?? 'this comment'}`} replyToId={comment.id} onDone={() => setMode('read')} />}
    </article>
  );
}
