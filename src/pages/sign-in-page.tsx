import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { Card } from '../components/card';
import { SignInForm } from '../features/auth/components/sign-in-form';
import { DemoAccountsList } from '../features/auth/components/demo-accounts-list';

export function SignInPage() {
  const [email, setEmail] = useState('');
  const navigate = useNavigate();
  return (
    <div className="mx-auto max-w-md">
      <title>Sign in · Tangentry</title>
      <h1 className="text-2xl font-semibold tracking-tight">Sign in</h1>
      <Card className="mt-6 p-5">
        <SignInForm email={email} onEmail={setEmail} onSignedIn={() => navigate('/team')} />
        <p className="mt-4 text-sm">
          <Link to="/forgot-password" className="underline decoration-vermilion/60 underline-offset-2 hover:decoration-vermilion">
            Forgot your password?
          </Link>
        </p>
      </Card>
      <DemoAccountsList onPick={setEmail} />
    </div>
  );
}
