import { useState, type FormEvent } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Card } from '../components/card';
import { FormAlert, TextField, primaryButton } from '../components/form-controls';
import { checkForm, formMessage, serverFields, type FieldErrors } from '../lib/form-errors';
import { resetCompleteSchema } from '../../shared/schemas/accounts';
import { useCompleteReset } from '../features/auth/api/complete-reset';

export function ResetPasswordPage() {
  const token = useParams().token ?? '';
  const [password, setPassword] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});
  const complete = useCompleteReset();

  function submit(event: FormEvent) {
    event.preventDefault();
    const checked = checkForm(resetCompleteSchema, { token, password });
    if (!checked.ok) return setFields(checked.fields);
    setFields({});
    complete.mutate(checked.data, { onError: (e) => setFields(serverFields(e)) });
  }

  return (
    <div className="mx-auto max-w-md">
      <title>Choose a new password · Tangentry</title>
      <h1 className="text-2xl font-semibold tracking-tight">Choose a new password</h1>
      <Card className="mt-6 p-5">
        {complete.isSuccess ? (
          <div className="space-y-3">
            <FormAlert tone="pass" message="Your password is changed and every device was signed out." />
            <Link to="/sign-in" className="underline">Sign in</Link>
          </div>
        ) : (
          <form noValidate onSubmit={submit} className="space-y-4" aria-label="Choose a new password">
            <FormAlert message={fields.token ?? (complete.isError && !Object.keys(fields).length ? formMessage(complete.error) : null)} />
            <TextField id="reset-password" label="New password" type="password" autoComplete="new-password" value={password} onChange={(e) => setPassword(e.target.value)} error={fields.password} hint="At least 12 characters." />
            <button type="submit" disabled={complete.isPending} className={`w-full ${primaryButton}`}>
              Save the new password
            </button>
          </form>
        )}
      </Card>
    </div>
  );
}
