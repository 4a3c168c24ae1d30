import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { Card } from '../components/card';
import { FormAlert, TextField, primaryButton, dangerButton } from '../components/form-controls';
import { checkForm, formMessage, serverFields, type FieldErrors } from '../lib/form-errors';
import { passwordChangeSchema, profileSchema } from '../../shared/schemas/accounts';
import { ROLE_LABEL } from '../../shared/schemas/roles';
import { useUpdateProfile } from '../features/auth/api/update-profile';
import { useChangePassword } from '../features/auth/api/change-password';
import { useSignOut } from '../features/auth/api/sign-out';
import type { Me } from '../features/auth/api/get-me';
import { RequireSignIn } from './require-sign-in';

function NameForm({ me }: { me: Me }) {
  const [name, setName] = useState(me.user.name);
  const [fields, setFields] = useState<FieldErrors>({});
  const update = useUpdateProfile();
  function submit(e: FormEvent) {
    e.preventDefault();
    const c = checkForm(profileSchema, { name });
    if (!c.ok) return setFields(c.fields);
    setFields({});
    update.mutate(c.data, { onError: (err) => setFields(serverFields(err)) });
  }
  return (
    <form noValidate onSubmit={submit} className="space-y-3" aria-label="Name">
      <FormAlert tone="pass" message={update.isSuccess ? 'Name saved.' : null} />
      <TextField id="profile-name" label="Name" value={name} onChange={(e) => setName(e.target.value)} error={fields.name} />
      <button type="submit" className={primaryButton} disabled={update.isPending}>Save name</button>
    </form>
  );
}

function PasswordForm() {
  const [currentPassword, setCurrent] = useState('');
  const [newPassword, setNew] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});
  const change = useChangePassword();
  function submit(e: FormEvent) {
    e.preventDefault();
    const c = checkForm(passwordChangeSchema, { currentPassword, newPassword });
    if (!c.ok) return setFields(c.fields);
    setFields({});
    change.mutate(c.data, { onSuccess: () => { setCurrent(''); setNew(''); }, onError: (err) => setFields(serverFields(err)) });
  }
  return (
    <form noValidate onSubmit={submit} className="space-y-3" aria-label="Password">
      <FormAlert tone="pass" message={change.isSuccess ? 'Password changed; your other devices were signed out.' : null} />
      <FormAlert message={change.isError && !Object.keys(fields).length ? formMessage(change.error) : null} />
      <TextField id="profile-current" label="Current password" type="password" autoComplete="current-password" value={currentPassword} onChange={(e) => setCurrent(e.target.value)} error={fields.currentPassword} />
      <TextField id="profile-new" label="New password" type="password" autoComplete="new-password" value={newPassword} onChange={(e) => setNew(e.target.value)} error={fields.newPassword} hint="At least 12 characters." />
      <button type="submit" className={primaryButton} disabled={change.isPending}>Change password</button>
    </form>
  );
}

export function ProfilePage() {
  const signOut = useSignOut();
  const navigate = useNavigate();
  return (
    <RequireSignIn>
      {({ me }) => (
        <div className="mx-auto max-w-2xl">
          <title>Profile · Tangentry</title>
          <h1 className="text-2xl font-semibold tracking-tight">Profile</h1>
          <p className="mt-1 font-mono text-sm">{me.user.email}</p>
          <p className="mt-1 text-sm">{me.teams.map((t) => `${ROLE_LABEL[t.role]} in ${t.name}`).join(' · ')}</p>
          <div className="mt-6 grid gap-6 sm:grid-cols-2">
            <Card className="p-5"><NameForm me={me} /></Card>
            <Card className="p-5"><PasswordForm /></Card>
          </div>
          <Card className="mt-6 p-5">
            <h2 className="font-semibold">Every device</h2>
            <p className="mt-1 text-sm">Ends every session of this account, here and on every other computer.</p>
            <button type="button" className={`mt-3 ${dangerButton}`} onClick={() => signOut.mutate(true, { onSuccess: () => navigate('/sign-in') })}>
              Sign out everywhere
            </button>
          </Card>
        </div>
      )}
    </RequireSignIn>
  );
}
