import { useState } from 'react';
import { Link, useSearchParams } from 'react-router';
import { AuthCard } from '../../features/auth/components/auth-card';
import { ForgotPasswordForm, ResetPasswordForm } from '../../features/auth/components/password-forms';
import { paths } from '../../lib/paths';

/** `/reset-password?token=…` from the e-mail; without a token, asks for a new link. */
export default function ResetPasswordPage() {
  const [params] = useSearchParams();
  const token = params.get('token');
  const [done, setDone] = useState(false);
  return (
    <AuthCard title="Choose a new password" titleId="reset-title">
      {done ? (
        <div role="status" className="space-y-3 text-sm text-ink-900">
          <p>Your password has been changed. Other sessions of your account have been signed out.</p>
          <Link to={paths.signIn.href()} className="font-medium text-ink-800 underline">
            Sign in with the new password
          </Link>
        </div>
      ) : token ? (
        <ResetPasswordForm token={token} onDone={() => setDone(true)} />
      ) : (
        <>
          <p className="text-sm text-ink-700">This link has no reset token. Ask for a new one:</p>
          <ForgotPasswordForm />
        </>
      )}
    </AuthCard>
  );
}
