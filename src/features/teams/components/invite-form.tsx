import { useState, type FormEvent } from 'react';
import { inviteSchema } from '../../../../shared/schemas/accounts';
import { ROLES, ROLE_LABEL, ROLE_SUMMARY, type Role } from '../../../../shared/schemas/roles';
import { checkForm, formMessage, serverFields, type FieldErrors } from '../../../lib/form-errors';
import { FormAlert, SelectField, TextField, primaryButton } from '../../../components/form-controls';
import { useInvite } from '../api/invite';

export function InviteForm({ teamId, teamName }: { teamId: string; teamName: string }) {
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<Role>('animator');
  const [fields, setFields] = useState<FieldErrors>({});
  const [sent, setSent] = useState<string | null>(null);
  const invite = useInvite(teamId);

  function submit(event: FormEvent) {
    event.preventDefault();
    setSent(null);
    const checked = checkForm(inviteSchema, { email, role });
    if (!checked.ok) return setFields(checked.fields);
    setFields({});
    invite.mutate(checked.data, {
      onSuccess: () => {
        setSent(`Invitation sent to ${checked.data.email}.`);
        setEmail('');
      },
      onError: (e) => setFields(serverFields(e)),
    });
  }

  return (
    <form noValidate onSubmit={submit} className="space-y-3" aria-label="Invite someone">
      <FormAlert message={invite.isError && !Object.keys(fields).length ? formMessage(invite.error) : null} />
      <FormAlert tone="pass" message={sent} />
      <TextField id="invite-email" label="E-mail" type="email" value={email} onChange={(e) => setEmail(e.target.value)} error={fields.email} />
      <SelectField id="invite-role" label={`Role in ${teamName}`} value={role} onChange={(e) => setRole(e.target.value as Role)} error={fields.role}>
        {ROLES.map((r) => (
          <option key={r} value={r}>
            {ROLE_LABEL[r]} — {ROLE_SUMMARY[r]}
          </option>
        ))}
      </SelectField>
      <button type="submit" disabled={invite.isPending} className={primaryButton}>
        {invite.isPending ? 'Sending…' : 'Send invitation'}
      </button>
    </form>
  );
}
