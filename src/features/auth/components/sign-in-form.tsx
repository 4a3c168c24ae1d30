import { useState, type FormEvent } from 'react';
import { signInSchema } from '../../../../shared/schemas/accounts';
import { checkForm, formMessage, serverFields, type FieldErrors } from '../../../lib/form-errors';
import { FormAlert, TextField, primaryButton } from '../../../components/form-controls';
import { useSignIn } from '../api/sign-in';

export function SignInForm({ email, onEmail, onSignedIn }: { email: string; onEmail: (v: string) => void; onSignedIn: () => void }) {
  const [password, setPassword] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});
  const signIn = useSignIn();

  function submit(event: FormEvent) {
    event.preventDefault();
    const checked = checkForm(signInSchema, { email, password });
    if (!checked.ok) return setFields(checked.fields);
    setFields({});
    signIn.mutate(checked.data, { onSuccess: onSignedIn, onError: (e) => setFields(serverFields(e)) });
  }

  return (
    <form noValidate onSubmit={submit} className="space-y-4" aria-label="Sign in">
      <FormAlert message={signIn.isError ? formMessage(signIn.error) : null} />
      <TextField id="sign-in-email" label="Email" name="email" type="email" autoComplete="email" value={email} onChange={(e) => onEmail(e.target.value)} error={fields.email} />
      <TextField id="sign-in-password" label="Password" name="password" type="password" autoComplete="current-password" value={password} onChange={(e) => setPassword(e.target.value)} error={fields.password} />
      <button type="submit" disabled={signIn.isPending} className={`w-full ${primaryButton}`}>
        {signIn.isPending ? 'Signing in…' : 'Sign in'}
      </button>
    </form>
  );
}
