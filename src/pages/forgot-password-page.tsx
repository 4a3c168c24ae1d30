import { useState, type FormEvent } from 'react';
import { Card } from '../components/card';
import { FormAlert, TextField, primaryButton } from '../components/form-controls';
import { checkForm, formMessage, serverFields, type FieldErrors } from '../lib/form-errors';
import { resetRequestSchema } from '../../shared/schemas/accounts';
import { useRequestReset } from '../features/auth/api/request-reset';

export function ForgotPasswordPage() {
  const [email, setEmail] = useState('');
  const [fields, setFields] = useState<FieldErrors>({});
  const request = useRequestReset();

  function submit(event: FormEvent) {
    event.preventDefault();
    const checked = checkForm(resetRequestSchema, { email });
    if (!checked.ok) return setFields(checked.fields);
    setFields({});
    request.mutate(checked.data, { onError: (e) => setFields(serverFields(e)) });
  }

  return (
    <div className="mx-auto max-w-md">
      <title>Reset password · Tangentry</title>
      <h1 className="text-2xl font-semibold tracking-tight">Reset your password</h1>
      <Card className="mt-6 p-5">
        {request.isSuccess ? (
          <FormAlert tone="pass" message={request.data.message} />
        ) : (
          <form noValidate onSubmit={submit} className="space-y-4" aria-label="Ask for a reset link">
            <FormAlert message={request.isError && !Object.keys(fields).length ? formMessage(request.error) : null} />
            <TextField id="reset-email" label="Email" type="email" autoComplete="email" value={email} onChange={(e) => setEmail(e.target.value)} error={fields.email} />
            <button type="submit" disabled={request.isPending} className={`w-full ${primaryButton}`}>
              Send a reset link
            </button>
          </form>
        )}
      </Card>
    </div>
  );
}
