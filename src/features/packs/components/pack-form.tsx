import { useState, type FormEvent } from 'react';
import { packCreateSchema, packUpdateSchema, type PackDto } from '../../../../shared/schemas/packs';
import { FormAlert, TextField, inputClass, primaryButton, secondaryButton } from '../../../components/form-controls';
import { checkForm, formMessage, serverFields, type FieldErrors } from '../../../lib/form-errors';
import { useSavePack } from '../api/save-pack';

/** Create a pack, or rename / re-describe / re-tag one (the slug stays: build servers name packs by it). */
export function PackForm({ teamId, editing, onDone }: { teamId: string; editing: PackDto | null; onDone: (pack: PackDto) => void }) {
  const [name, setName] = useState(editing?.name ?? '');
  const [slug, setSlug] = useState('');
  const [description, setDescription] = useState(editing?.description ?? '');
  const [frameRate, setFrameRate] = useState(String(editing?.frameRate ?? 60));
  const [tags, setTags] = useState(editing?.tags.join(', ') ?? '');
  const [fields, setFields] = useState<FieldErrors>({});
  const save = useSavePack(teamId);

  function submit(e: FormEvent) {
    e.preventDefault();
    const fr = Number(frameRate.trim());
    const body = {
      name,
      ...(editing || !slug.trim() ? {} : { slug: slug.trim() }),
      description,
      frameRate: frameRate.trim() !== '' && Number.isFinite(fr) ? fr : frameRate,
      tags: tags.split(',').map((t) => t.trim()).filter(Boolean),
    };
    const checked = checkForm(editing ? packUpdateSchema : packCreateSchema, body);
    if (!checked.ok) {
      // tag issues are reported per entry (tags.1); show them beside the one tags field
      setFields(Object.fromEntries(Object.entries(checked.fields).map(([k, v]) => [k.startsWith('tags') ? 'tags' : k, v])));
      return;
    }
    setFields({});
    save.mutate({ slug: editing?.slug, body: checked.data }, { onSuccess: (r) => onDone(r.pack), onError: (err) => setFields(serverFields(err)) });
  }

  const id = editing ? 'pack-edit' : 'pack-new';
  return (
    <form onSubmit={submit} noValidate aria-labelledby={`${id}-heading`} className="space-y-4">
      <h2 id={`${id}-heading`} className="text-lg font-semibold">{editing ? `Edit pack “${editing.name}”` : 'New pack'}</h2>
      <FormAlert message={save.isError && !Object.keys(serverFields(save.error)).length ? formMessage(save.error) : null} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField id={`${id}-name`} label="Name" value={name} onChange={(e) => setName(e.target.value)} error={fields.name} placeholder="e.g. Loading screens" />
        {editing ? (
          <TextField id={`${id}-slug`} label="Slug" value={editing.slug} disabled hint="Slugs never change: build servers and tokens name packs by them." />
        ) : (
          <TextField id={`${id}-slug`} label="Slug (optional)" value={slug} onChange={(e) => setSlug(e.target.value)} error={fields.slug} className={`${inputClass} font-mono`} hint="Empty: made from the name, like loading-screens." />
        )}
        <TextField id={`${id}-frame-rate`} label="Frame rate (fps)" inputMode="decimal" className={`${inputClass} font-mono`} value={frameRate} onChange={(e) => setFrameRate(e.target.value)} error={fields.frameRate} />
        <TextField id={`${id}-tags`} label="Tags" value={tags} onChange={(e) => setTags(e.target.value)} error={fields.tags} hint="Comma-separated, like menu, ui." />
        <div className="sm:col-span-2">
          <TextField id={`${id}-description`} label="Description" value={description} onChange={(e) => setDescription(e.target.value)} error={fields.description} />
        </div>
      </div>
      <div className="flex gap-3">
        <button type="submit" className={primaryButton} disabled={save.isPending}>{save.isPending ? 'Saving…' : editing ? 'Save pack' : 'Create pack'}</button>
        {editing ? <button type="button" className={secondaryButton} onClick={() => onDone(editing)}>Cancel</button> : null}
      </div>
    </form>
  );
}
