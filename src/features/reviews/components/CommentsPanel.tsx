/** The review's comments, and a form to comment on the fit as a whole or on one coefficient. */
import { useState } from 'react';
import type { ReviewDetailDto } from '@shared/reviews';
import { Button } from '@/components/Button';
import { SelectField, TextField } from '@/components/Field';
import { Notice } from '@/components/Notice';
import { useAddComment } from '../api/add-comment';
import { formatWhen } from '@/lib/dates';

interface Props {
  workspaceId: string;
  review: ReviewDetailDto;
  canComment: boolean;
  term: string | null;
  onTermChange: (term: string | null) => void;
  terms: string[];
}

export function CommentsPanel({ workspaceId, review, canComment, term, onTermChange, terms }: Props) {
  const [body, setBody] = useState('');
  const add = useAddComment(workspaceId, review.id);
  return (
    <section aria-labelledby="comments-heading" className="space-y-3">
      <h2 id="comments-heading" className="text-base font-bold">
        Comments ({review.comments.length})
      </h2>
      <ul className="space-y-2">
        {review.comments.map((c) => (
          <li key={c.id} className="rounded-md border border-slate-200 bg-white px-3 py-2 text-sm dark:border-slate-800 dark:bg-slate-900">
            <div className="text-xs text-slate-500">
              {c.author.name ?? 'a former member'} · {formatWhen(c.createdAt)} · {c.term ? <span className="font-mono">on {c.term}</span> : 'on the fit'}
            </div>
            <p className="whitespace-pre-wrap">{c.body}</p>
          </li>
        ))}
      </ul>
      {canComment && (
        <form
          className="space-y-2"
          onSubmit={(e) => {
            e.preventDefault();
            add.mutate({ body, ...(term ? { term } : {}) }, { onSuccess: () => setBody('') });
          }}
        >
          <SelectField
            label="About"
            value={term ?? ''}
            onChange={(e) => onTermChange(e.target.value || null)}
            options={[{ value: '', label: 'The fit as a whole' }, ...terms.map((t) => ({ value: t, label: `Coefficient ${t}` }))]}
          />
          <TextField label="Comment" value={body} onChange={(e) => setBody(e.target.value)} />
          {add.error && <Notice tone="error">{add.error.message}</Notice>}
          <Button type="submit" variant="secondary" disabled={!body.trim()} busy={add.isPending} busyLabel="Saving…">
            Add the comment
          </Button>
        </form>
      )}
    </section>
  );
}
