import { useState, type FormEvent } from 'react';
import { commentSchema } from '../../../../shared/schemas/comments';
import { FieldError, FormAlert, inputClass, primaryButton } from '../../../components/form-controls';
import { checkForm, formMessage, serverFields, type FieldErrors } from '../../../lib/form-errors';
import { useAddComment } from '../api/comments';

export interface CurveSpan {
  name: string;
  from: number;
  to: number;
}

/** Write a comment on the version, or pin it to one of its curves and (optionally) a time on that curve. */
export function CommentForm({ teamId, slug, number, curves }: { teamId: string; slug: string; number: number; curves: CurveSpan[] }) {
  const [body, setBody] = useState('');
  const [curve, setCurve] = useState('');
  const [time, setTime] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});
  const add = useAddComment(teamId, slug, number);
  const span = curves.find((c) => c.name === curve);
  function submit(e: FormEvent) {
    e.preventDefault();
    const value = { body, curve: curve || null, time: curve && time.trim() !== '' ? Number(time) : null };
    const checked = checkForm(commentSchema, value);
    if (!checked.ok) return setFields(checked.fields);
    if (span && value.time !== null && (value.time < span.from || value.time > span.to)) {
      return setFields({ time: `time: must be between ${span.from} and ${span.to} s` });
    }
    setFields({});
    add.mutate(checked.data, { onSuccess: () => { setBody(''); setTime(''); }, onError: (err) => setFields(serverFields(err)) });
  }
  return (
    <form onSubmit={submit} noValidate aria-labelledby="comment-form-heading" className="space-y-3">
      <h3 id="comment-form-heading" className="font-semibold">Add a comment</h3>
      <FormAlert message={add.isError && !Object.keys(serverFields(add.error)).length ? formMessage(add.error) : null} />
      <div>
        <label htmlFor="comment-body" className="text-sm font-medium">Comment</label>
        <textarea id="comment-body" rows={2} className={inputClass} value={body} onChange={(e) => setBody(e.target.value)}
          aria-invalid={fields.body ? true : undefined} aria-describedby={fields.body ? 'comment-body-error' : undefined} />
        <FieldError id="comment-body-error" message={fields.body} />
      </div>
      <div className="flex flex-wrap gap-4">
        <div>
          <label htmlFor="comment-curve" className="text-sm font-medium">About</label>
          <select id="comment-curve" className={`${inputClass} font-mono`} value={curve} onChange={(e) => { setCurve(e.target.value); if (!e.target.value) setTime(''); }}
            aria-invalid={fields.curve ? true : undefined} aria-describedby={fields.curve ? 'comment-curve-error' : undefined}>
            <option value="">the whole version</option>
            {curves.map((c) => <option key={c.name} value={c.name}>{c.name}</option>)}
          </select>
          <FieldError id="comment-curve-error" message={fields.curve} />
        </div>
        <div>
          <label htmlFor="comment-time" className="text-sm font-medium">At time (s)</label>
          <input id="comment-time" type="number" step="any" inputMode="decimal" className={`${inputClass} font-mono`} value={time} disabled={!curve}
            onChange={(e) => setTime(e.target.value)} placeholder={span ? `${span.from} – ${span.to}` : 'choose a curve'}
            aria-invalid={fields.time ? true : undefined} aria-describedby={fields.time ? 'comment-time-error' : 'comment-time-hint'} />
          {fields.time ? <FieldError id="comment-time-error" message={fields.time} />
            : <p id="comment-time-hint" className="mt-1 text-xs text-ink/65 dark:text-paper/65">{span ? `optional; inside ${span.from}–${span.to} s` : 'optional; pick a curve first'}</p>}
        </div>
      </div>
      <button type="submit" className={primaryButton} disabled={add.isPending}>{add.isPending ? 'Posting…' : 'Post comment'}</button>
    </form>
  );
}
