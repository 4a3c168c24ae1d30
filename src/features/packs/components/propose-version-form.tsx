import { useState, type FormEvent } from 'react';
import { proposeVersionSchema, type VersionDto } from '../../../../shared/schemas/versions';
import { FieldError, FormAlert, inputClass, primaryButton } from '../../../components/form-controls';
import { checkForm, formMessage, serverFields, type FieldErrors } from '../../../lib/form-errors';
import { useProposeVersion } from '../api/versions';

/** Propose the next version of the pack with a changelog; the server bakes every target before answering. */
export function ProposeVersionForm({ teamId, slug, nextNumber, onProposed }: { teamId: string; slug: string; nextNumber: number; onProposed: (v: VersionDto) => void }) {
  const [changelog, setChangelog] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});
  const propose = useProposeVersion(teamId, slug);
  function submit(e: FormEvent) {
    e.preventDefault();
    const checked = checkForm(proposeVersionSchema, { changelog });
    if (!checked.ok) return setFields(checked.fields);
    setFields({});
    propose.mutate(checked.data.changelog, { onSuccess: onProposed, onError: (err) => setFields(serverFields(err)) });
  }
  return (
    <form onSubmit={submit} noValidate aria-labelledby="propose-heading" className="space-y-3">
      <h2 id="propose-heading" className="text-lg font-semibold">Propose v{nextNumber}</h2>
      <p className="text-sm">The pack's curves as they are now become v{nextNumber}: stored unchangeable, baked for every target profile of the team, then reviewed by a lead.</p>
      <FormAlert message={propose.isError && !Object.keys(serverFields(propose.error)).length ? formMessage(propose.error) : null} />
      <div>
        <label htmlFor="propose-changelog" className="text-sm font-medium">Changelog</label>
        <textarea id="propose-changelog" rows={3} className={inputClass} value={changelog} onChange={(e) => setChangelog(e.target.value)}
          aria-invalid={fields.changelog ? true : undefined} aria-describedby={fields.changelog ? 'propose-changelog-error' : undefined} placeholder="What changed, and why" />
        <FieldError id="propose-changelog-error" message={fields.changelog} />
      </div>
      <button type="submit" className={primaryButton} disabled={propose.isPending}>{propose.isPending ? 'Baking and storing…' : `Propose v${nextNumber}`}</button>
    </form>
  );
}
