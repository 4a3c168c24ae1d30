import { useState, type FormEvent } from 'react';
import { reviewSchema, type ReviewDecision } from '../../../../shared/schemas/versions';
import { FieldError, FormAlert, inputClass, primaryButton } from '../../../components/form-controls';
import { checkForm, formMessage, serverFields, type FieldErrors } from '../../../lib/form-errors';
import { useReviewVersion } from '../api/versions';

/** A lead's decision on a version: approve, or request changes (which needs a comment). */
export function ReviewForm({ teamId, slug, number }: { teamId: string; slug: string; number: number }) {
  const [decision, setDecision] = useState<ReviewDecision>('approve');
  const [comment, setComment] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});
  const review = useReviewVersion(teamId, slug, number);
  function submit(e: FormEvent) {
    e.preventDefault();
    const checked = checkForm(reviewSchema, { decision, comment });
    if (!checked.ok) return setFields(checked.fields);
    setFields({});
    review.mutate(checked.data, { onSuccess: () => setComment(''), onError: (err) => setFields(serverFields(err)) });
  }
  return (
    <form onSubmit={submit} noValidate aria-labelledby="review-heading" className="space-y-3">
      <h3 id="review-heading" className="font-semibold">Your review of v{number}</h3>
      <FormAlert message={review.isError && !Object.keys(serverFields(review.error)).length ? formMessage(review.error) : null} />
      <fieldset className="flex gap-4 text-sm">
        <legend className="sr-only">Decision</legend>
        <label className="flex items-center gap-1"><input type="radio" name="decision" checked={decision === 'approve'} onChange={() => setDecision('approve')} /> Approve</label>
        <label className="flex items-center gap-1"><input type="radio" name="decision" checked={decision === 'request-changes'} onChange={() => setDecision('request-changes')} /> Request changes</label>
      </fieldset>
      <div>
        <label htmlFor="review-comment" className="text-sm font-medium">Review comment</label>
        <textarea id="review-comment" rows={2} className={inputClass} value={comment} onChange={(e) => setComment(e.target.value)}
          aria-invalid={fields.comment ? true : undefined} aria-describedby={fields.comment ? 'review-comment-error' : undefined} />
        <FieldError id="review-comment-error" message={fields.comment} />
      </div>
      <button type="submit" className={primaryButton} disabled={review.isPending}>{review.isPending ? 'Sending…' : 'Send review'}</button>
    </form>
  );
}
