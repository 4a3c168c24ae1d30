import { useEffect, useRef, useState, type FormEvent } from 'react';
import { proposeVersionSchema } from '../../../../shared/schemas/versions';
import { FieldError, FormAlert, inputClass, primaryButton } from '../../../components/form-controls';
import { checkForm, formMessage, serverFields, type FieldErrors } from '../../../lib/form-errors';
import { useBake, useProposeBake, useVersionsRefresh } from '../api/bakes';

/**
 * Propose the next version of the pack with a changelog. The server stores the curves as they are and
 * bakes every target in the background (202 { bake }); the form follows that bake and calls `onProposed`
 * with the version once it exists. Progress bars and failures are shown by BakeProgress on the pack page.
 */
export function ProposeVersionForm({ teamId, slug, nextNumber, onProposed }: { teamId: string; slug: string; nextNumber: number; onProposed: (v: { number: number }) => void }) {
  const [changelog, setChangelog] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});
  const [bakeId, setBakeId] = useState<string | null>(null);
  const propose = useProposeBake(teamId, slug);
  const bake = useBake(teamId, slug, bakeId);
  const refreshVersions = useVersionsRefresh(teamId, slug);
  const state = bake.data?.state;
  const reported = useRef<string | null>(null);
  useEffect(() => {
    if (state === 'done' && bake.data?.version && reported.current !== bake.data.id) {
      reported.current = bake.data.id;
      void refreshVersions();
      onProposed({ number: bake.data.version });
    }
  }, [state, bake.data?.id, bake.data?.version, onProposed, refreshVersions]);
  const waiting = propose.isPending || (bakeId !== null && (state === undefined || state === 'queued' || state === 'baking'));
  function submit(e: FormEvent) {
    e.preventDefault();
    const checked = checkForm(proposeVersionSchema, { changelog });
    if (!checked.ok) return setFields(checked.fields);
    setFields({});
    setBakeId(null);
    propose.mutate(checked.data.changelog, { onSuccess: (b) => setBakeId(b.id), onError: (err) => setFields(serverFields(err)) });
  }
  return (
    <form onSubmit={submit} noValidate aria-labelledby="propose-heading" className="space-y-3">
      <h2 id="propose-heading" className="text-lg font-semibold">Propose v{nextNumber}</h2>
      <p className="text-sm">The pack's curves as they are now become v{nextNumber}: stored unchangeable, baked for every target profile of the team in the background, then reviewed by a lead.</p>
      <FormAlert message={propose.isError && !Object.keys(serverFields(propose.error)).length ? formMessage(propose.error) : null} />
      {state === 'failed' ? <FormAlert message="The bake failed; see the reason above the versions and retry it there." /> : null}
      <div>
        <label htmlFor="propose-changelog" className="text-sm font-medium">Changelog</label>
        <textarea id="propose-changelog" rows={3} className={inputClass} value={changelog} onChange={(e) => setChangelog(e.target.value)}
          aria-invalid={fields.changelog ? true : undefined} aria-describedby={fields.changelog ? 'propose-changelog-error' : undefined} placeholder="What changed, and why" />
        <FieldError id="propose-changelog-error" message={fields.changelog} />
      </div>
      <button type="submit" className={primaryButton} disabled={waiting}>{waiting ? 'Baking in the background…' : `Propose v${nextNumber}`}</button>
    </form>
  );
}
