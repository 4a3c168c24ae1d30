import { useState, type FormEvent } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { Card } from '../components/card';
import { FormAlert, TextField, primaryButton } from '../components/form-controls';
import { checkForm, formMessage, serverFields, type FieldErrors } from '../lib/form-errors';
import { acceptInvitationSchema, acceptNewAccountSchema } from '../../shared/schemas/accounts';
import { ROLE_LABEL } from '../../shared/schemas/roles';
import { useInvitation } from '../features/auth/api/get-invitation';
import { useAcceptInvitation } from '../features/auth/api/accept-invitation';

export function AcceptInvitationPage() {
  const token = useParams().token ?? '';
  const invitation = useInvitation(token);
  const accept = useAcceptInvitation();
  const navigate = useNavigate();
  const [name, setName] = useState('');
  const [password, setPassword] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});

  function submit(event: FormEvent) {
    event.preventDefault();
    const existing = invitation.data?.accountExists;
    const checked = existing ? checkForm(acceptInvitationSchema, { token, password }) : checkForm(acceptNewAccountSchema, { token, name, password });
    if (!checked.ok) return setFields(checked.fields);
    setFields({});
    accept.mutate(checked.data, { onSuccess: () => navigate('/team'), onError: (e) => setFields(serverFields(e)) });
  }

  return (
    <div className="mx-auto max-w-md">
      <title>Accept invitation · Tangentry</title>
      <h1 className="text-2xl font-semibold tracking-tight">Join a team</h1>
      {invitation.isPending ? <p className="mt-4">Checking the invitation…</p> : null}
      {invitation.isError ? <div className="mt-4"><FormAlert message={formMessage(invitation.error)} /></div> : null}
      {invitation.data ? (
        <Card className="mt-6 p-5">
          <p className="mb-4">
            <strong>{invitation.data.teamName}</strong> of {invitation.data.studioName} invites <span className="font-mono text-sm">{invitation.data.email}</span> as{' '}
            <strong>{ROLE_LABEL[invitation.data.role]}</strong>.
          </p>
          <form noValidate onSubmit={submit} className="space-y-4" aria-label="Accept invitation">
            <FormAlert message={accept.isError && !Object.keys(fields).length ? formMessage(accept.error) : null} />
            {fields.token ? <FormAlert message={fields.token} /> : null}
            {invitation.data.accountExists ? (
              <TextField id="accept-password" label="Your password" type="password" autoComplete="current-password" value={password} onChange={(e) => setPassword(e.target.value)} error={fields.password} hint="This address already has an account: confirm with its password." />
            ) : (
              <>
                <TextField id="accept-name" label="Your name" autoComplete="name" value={name} onChange={(e) => setName(e.target.value)} error={fields.name} />
                <TextField id="accept-password" label="Choose a password" type="password" autoComplete="new-password" value={password} onChange={(e) => setPassword(e.target.value)} error={fields.password} hint="At least 12 characters; a phrase of several words is good." />
              </>
            )}
            <button type="submit" disabled={accept.isPending} className={`w-full ${primaryButton}`}>
              Join {invitation.data.teamName}
            </button>
          </form>
        </Card>
      ) : null}
    </div>
  );
}
