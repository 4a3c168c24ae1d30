import { useState, type FormEvent } from 'react';
import { ENCODINGS, KERNELS, LAYOUTS, parseProfile, type Profile } from '../../../../shared/bake/profile';
import { FormAlert, SelectField, TextField, primaryButton, secondaryButton } from '../../../components/form-controls';
import { formMessage, serverFields, type FieldErrors } from '../../../lib/form-errors';
import { isApiError } from '../../../lib/api-client';
import type { StoredProfileDto } from '../../../../shared/schemas/profiles';
import { useSaveProfile } from '../api/save-profile';
import { ENCODING_HELP, KERNEL_HELP, LAYOUT_HELP } from './profile-format';

interface Draft {
  name: string;
  toleranceMode: 'absolute' | 'relative';
  toleranceValue: string;
  kernel: Profile['kernel'];
  layout: Profile['layout'];
  encoding: Profile['encoding'];
  byteCap: string;
  rule: Profile['sampleCount']['rule'];
  frameRate: string;
  output: Profile['output'];
}

const EMPTY: Draft = {
  name: '', toleranceMode: 'absolute', toleranceValue: '1e-3', kernel: 'hermite', layout: 'uniform', encoding: 'f32',
  byteCap: '', rule: 'any', frameRate: '', output: 'table',
};

function draftOf(p: Profile): Draft {
  return {
    name: p.name, toleranceMode: p.tolerance.mode, toleranceValue: String(p.tolerance.value), kernel: p.kernel, layout: p.layout,
    encoding: p.encoding, byteCap: p.byteCap === undefined ? '' : String(p.byteCap), rule: p.sampleCount.rule,
    frameRate: p.sampleCount.rule === 'frame-aligned' && p.sampleCount.frameRate ? String(p.sampleCount.frameRate) : '', output: p.output,
  };
}

/** Text fields become numbers here; an unparsable number stays a string so the schema names the field. */
function num(s: string): number | string {
  const t = s.trim();
  if (t === '') return t;
  const n = Number(t);
  return Number.isFinite(n) ? n : t;
}

function candidate(d: Draft): unknown {
  return {
    name: d.name,
    tolerance: { mode: d.toleranceMode, value: num(d.toleranceValue) },
    kernel: d.kernel,
    layout: d.layout,
    encoding: d.encoding,
    ...(d.byteCap.trim() ? { byteCap: num(d.byteCap) } : {}),
    sampleCount: d.rule === 'frame-aligned' ? { rule: d.rule, ...(d.frameRate.trim() ? { frameRate: num(d.frameRate) } : {}) } : { rule: d.rule },
    output: d.output,
  };
}

/** Create or edit one target profile; checked with the shared ProfileSchema before it is sent. */
export function ProfileForm({ teamId, editing, onDone }: { teamId: string; editing: StoredProfileDto | null; onDone: () => void }) {
  const [draft, setDraft] = useState<Draft>(editing ? draftOf(editing.profile) : EMPTY);
  const [fields, setFields] = useState<FieldErrors>({});
  const save = useSaveProfile(teamId);
  const set = <K extends keyof Draft>(k: K) => (e: { target: { value: string } }) => setDraft((d) => ({ ...d, [k]: e.target.value as Draft[K] }));

  function submit(e: FormEvent) {
    e.preventDefault();
    const parsed = parseProfile(candidate(draft));
    if (!parsed.ok) {
      setFields(Object.fromEntries(parsed.issues.map((i) => [i.path || 'form', i.message])));
      return;
    }
    setFields({});
    save.mutate(
      { id: editing?.id, version: editing?.version, profile: parsed.profile },
      { onSuccess: onDone, onError: (err) => setFields(serverFields(err)) },
    );
  }

  const conflict = isApiError(save.error) && save.error.code === 'version_conflict';
  const f = (k: string) => fields[k];
  return (
    <form onSubmit={submit} noValidate aria-labelledby="profile-form-heading" className="space-y-4">
      <h2 id="profile-form-heading" className="text-lg font-semibold">
        {editing ? `Edit “${editing.profile.name}”` : 'New target profile'}
      </h2>
      <FormAlert message={conflict ? 'Someone else saved this profile since you opened it. Close the form and open it again to see their change.' : save.isError && !Object.keys(serverFields(save.error)).length ? formMessage(save.error) : null} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField id="profile-name" label="Name" value={draft.name} onChange={set('name')} error={f('name')} placeholder="e.g. Console" />
        <div className="grid grid-cols-2 gap-2">
          <SelectField id="profile-tolerance-mode" label="Tolerance is" value={draft.toleranceMode} onChange={set('toleranceMode')} error={f('tolerance.mode')}>
            <option value="absolute">absolute (curve units)</option>
            <option value="relative">relative to value range</option>
          </SelectField>
          <TextField id="profile-tolerance-value" label="Tolerance" inputMode="decimal" className="font-mono" value={draft.toleranceValue} onChange={set('toleranceValue')} error={f('tolerance.value')} />
        </div>
        <SelectField id="profile-kernel" label="Kernel" value={draft.kernel} onChange={set('kernel')} error={f('kernel')}>
          {KERNELS.map((k) => <option key={k} value={k}>{`${k} — ${KERNEL_HELP[k]}`}</option>)}
        </SelectField>
        <SelectField id="profile-layout" label="Layout" value={draft.layout} onChange={set('layout')} error={f('layout')}>
          {LAYOUTS.map((k) => <option key={k} value={k}>{`${k} — ${LAYOUT_HELP[k]}`}</option>)}
        </SelectField>
        <SelectField id="profile-encoding" label="Encoding" value={draft.encoding} onChange={set('encoding')} error={f('encoding')}>
          {ENCODINGS.map((k) => <option key={k} value={k}>{`${k} — ${ENCODING_HELP[k]}`}</option>)}
        </SelectField>
        <TextField id="profile-byte-cap" label="Byte cap (optional)" inputMode="numeric" className="font-mono" value={draft.byteCap} onChange={set('byteCap')} error={f('byteCap')} hint="Largest table, in bytes, a curve may take." />
        <div className="grid grid-cols-2 gap-2">
          <SelectField id="profile-rule" label="Entry count" value={draft.rule} onChange={set('rule')} error={f('sampleCount.rule')}>
            <option value="any">any</option>
            <option value="power-of-two">power of two</option>
            <option value="frame-aligned">frame-aligned</option>
          </SelectField>
          <TextField id="profile-frame-rate" label="Frame rate (fps)" inputMode="decimal" className="font-mono" disabled={draft.rule !== 'frame-aligned'} value={draft.frameRate} onChange={set('frameRate')} error={f('sampleCount.frameRate')} hint="Empty: the curve's own." />
        </div>
        <SelectField id="profile-output" label="Output" value={draft.output} onChange={set('output')} error={f('output')}>
          <option value="table">runtime table</option>
          <option value="css">CSS linear() (web)</option>
        </SelectField>
      </div>
      <div className="flex gap-3">
        <button type="submit" className={primaryButton} disabled={save.isPending}>
          {save.isPending ? 'Saving…' : editing ? 'Save profile' : 'Add profile'}
        </button>
        <button type="button" className={secondaryButton} onClick={onDone}>
          Cancel
        </button>
      </div>
    </form>
  );
}
