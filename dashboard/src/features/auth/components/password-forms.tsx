import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { ErrorState, fieldError } from '../../../components/ui/states';
import { useAcceptInvitation, useCompletePasswordReset, useRequestPasswordReset } from '../api/sign-in';

/** Asks for a reset link by e-mail; says the same whether or not the address has an account. */
export function ForgotPasswordForm() {
  const request = useRequestPasswordReset();
  const [email, setEmail] = useState('');
  if (request.isSuccess) {
    return (
      <p role="status" className="rounded-md bg-emerald-50 px-3 py-2 text-sm text-ink-900">
        If {email} has an account, a link to choose a new password is on its way. The link works once and expires.
      </p>
    );
  }
  return (
    <form
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        request.mutate({ email: email.trim() });
      }}
    >
      <TextField
        label="E-mail"
        type="email"
        autoComplete="username"
        required
        value={email}
        onChange={(e) => setEmail(e.target.value)}
        autoFocus
      />
      {request.isError ? <ErrorState error={request.error} /> : null}
      <Button type="submit" className="w-full" disabled={request.isPending || !email}>
        Send reset link
      </Button>
    </form>
  );
}

function NewPasswordFields({
  password,
  setPassword,
  repeat,
  setRepeat,
  error,
}: {
  password: string;
  setPassword: (v: string) => void;
  repeat: string;
  setRepeat: (v: string) => void;
  error: unknown;
}) {
  const mismatch = repeat.length > 0 && repeat !== password ? 'The two passwords differ' : undefined;
  return (
    <>
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        required
        value={password}
        onChange={(e) => setPassword(e.target.value)}
        hint="A long passphrase is easiest to remember and hardest to guess."
        error={fieldError(error, '/password')}
      />
      <TextField
        label="Repeat the password"
        type="password"
        autoComplete="new-password"
        required
        value={repeat}
        onChange={(e) => setRepeat(e.target.value)}
        error={mismatch}
      />
    </>
  );
}

export function ResetPasswordForm({ token, onDone }: { token: string; onDone: () => void }) {
  const complete = useCompletePasswordReset();
  const [password, setPassword] = useState('');
  const [repeat, setRepeat] = useState('');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    complete.mutate({ token, password }, { onSuccess: onDone });
  };
  return (
    <form className="space-y-4" onSubmit={submit}>
      <NewPasswordFields
        password={password}
        setPassword={setPassword}
        repeat={repeat}
        setRepeat={setRepeat}
        error={complete.error}
      />
      {complete.isError ? <ErrorState error={complete.error} /> : null}
      <Button type="submit" className="w-full" disabled={complete.isPending || !password || password !== repeat}>
        Set the new password
      </Button>
    </form>
  );
}

export function AcceptInvitationForm({ token, onDone }: { token: string; onDone: () => void }) {
  const accept = useAcceptInvitation();
  const [name, setName] = useState('');
  const [password, setPassword] = useState('');
  const [repeat, setRepeat] = useState('');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    accept.mutate({ token, name: name.trim(), password }, { onSuccess: onDone });
  };
  return (
    <form className="space-y-4" onSubmit={submit}>
      <TextField
        label="Your name"
        autoComplete="name"
        required
        value={name}
        onChange={(e) => setName(e.target.value)}
        autoFocus
        error={fieldError(accept.error, '/name')}
      />
      <NewPasswordFields
        password={password}
        setPassword={setPassword}
        repeat={repeat}
        setRepeat={setRepeat}
        error={accept.error}
      />
      {accept.isError ? <ErrorState error={accept.error} /> : null}
      <Button type="submit" className="w-full" disabled={accept.isPending || !name || !password || password !== repeat}>
        Join and sign in
      </Button>
    </form>
  );
}
