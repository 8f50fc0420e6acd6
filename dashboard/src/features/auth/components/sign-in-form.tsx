import { useState, type FormEvent } from 'react';
import { HeadroomApiError } from '@headroom/sdk';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { ErrorState } from '../../../components/ui/states';
import { useSignIn } from '../api/sign-in';

export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const signIn = useSignIn();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');

  const submit = (e: FormEvent) => {
    e.preventDefault();
    signIn.mutate({ email: email.trim(), password }, { onSuccess: onSignedIn });
  };

  const wrongCredentials = signIn.error instanceof HeadroomApiError && signIn.error.status === 401;
  return (
    <form onSubmit={submit} className="space-y-4" noValidate>
      <TextField
        label="E-mail"
        type="email"
        name="email"
        autoComplete="username"
        required
        value={email}
        onChange={(e) => setEmail(e.target.value)}
        autoFocus
      />
      <TextField
        label="Password"
        type="password"
        name="password"
        autoComplete="current-password"
        required
        value={password}
        onChange={(e) => setPassword(e.target.value)}
      />
      {signIn.isError ? (
        wrongCredentials ? (
          <p role="alert" className="rounded-md bg-red-50 px-3 py-2 text-sm font-medium text-verdict-over">
            That e-mail and password do not match an active account.
          </p>
        ) : (
          <ErrorState error={signIn.error} />
        )
      ) : null}
      <Button type="submit" className="w-full" disabled={signIn.isPending || !email || !password}>
        {signIn.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
