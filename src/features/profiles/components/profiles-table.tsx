import { useState } from 'react';
import type { StoredProfileDto } from '../../../../shared/schemas/profiles';
import { dangerButton, secondaryButton, FormAlert } from '../../../components/form-controls';
import { formMessage } from '../../../lib/form-errors';
import { useDeleteProfile } from '../api/delete-profile';
import { sampleCountText, toleranceText } from './profile-format';

/** The team's target profiles; editors get Edit and Delete (with a confirmation step). */
export function ProfilesTable({ teamId, profiles, canEdit, onEdit }: { teamId: string; profiles: StoredProfileDto[]; canEdit: boolean; onEdit: (p: StoredProfileDto) => void }) {
  const [confirming, setConfirming] = useState<string | null>(null);
  const remove = useDeleteProfile(teamId);
  if (profiles.length === 0) return <p className="text-sm">No target profiles yet.</p>;
  return (
    <div className="overflow-x-auto">
      <FormAlert message={remove.isError ? formMessage(remove.error) : null} />
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">Target profiles</caption>
        <thead>
          <tr className="border-b border-grid-major dark:border-night-line">
            {['Name', 'Tolerance', 'Kernel', 'Layout', 'Encoding', 'Byte cap', 'Entry count', 'Output'].map((h) => (
              <th key={h} scope="col" className="px-2 py-2 font-semibold">{h}</th>
            ))}
            {canEdit ? <th scope="col" className="px-2 py-2"><span className="sr-only">Actions</span></th> : null}
          </tr>
        </thead>
        <tbody>
          {profiles.map(({ id, profile: p, version }) => (
            <tr key={id} className="border-b border-grid-minor align-top dark:border-night-line">
              <th scope="row" className="px-2 py-2 font-medium">{p.name}</th>
              <td className="px-2 py-2 font-mono tabular-nums">{toleranceText(p)}</td>
              <td className="px-2 py-2 font-mono">{p.kernel}</td>
              <td className="px-2 py-2 font-mono">{p.layout}</td>
              <td className="px-2 py-2 font-mono">{p.encoding}</td>
              <td className="px-2 py-2 font-mono tabular-nums">{p.byteCap === undefined ? '—' : `${p.byteCap} B`}</td>
              <td className="px-2 py-2">{sampleCountText(p)}</td>
              <td className="px-2 py-2">{p.output === 'css' ? 'CSS linear()' : 'table'}</td>
              {canEdit ? (
                <td className="whitespace-nowrap px-2 py-2 text-right">
                  {confirming === id ? (
                    <span className="inline-flex items-center gap-2">
                      <span>Delete {p.name}?</span>
                      <button type="button" className={dangerButton} onClick={() => remove.mutate(id, { onSettled: () => setConfirming(null) })}>Delete</button>
                      <button type="button" className={secondaryButton} onClick={() => setConfirming(null)}>Keep</button>
                    </span>
                  ) : (
                    <span className="inline-flex gap-2">
                      <button type="button" className={secondaryButton} onClick={() => onEdit({ id, teamId, profile: p, version, position: 0, updatedAt: '' })} aria-label={`Edit ${p.name}`}>Edit</button>
                      <button type="button" className={secondaryButton} onClick={() => setConfirming(id)} aria-label={`Delete ${p.name}`}>Delete</button>
                    </span>
                  )}
                </td>
              ) : null}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
