import { useState } from 'react';
import { Navigate, useLocation, useNavigate, useSearchParams } from 'react-router';
import { AuthCard } from '../../features/auth/components/auth-card';
import { ForgotPasswordForm } from '../../features/auth/components/password-forms';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { safeNextPath } from '../../lib/paths';
import { useSession, type SignedOutReason } from '../../lib/session';

export default function SignInPage() {
  const session = useSession();
  const [params] = useSearchParams();
  const location = useLocation();
  const navigate = useNavigate();
  const [forgot, setForgot] = useState(false);
  const next = safeNextPath(params.get('next'));
  const reason = (location.state as { reason?: SignedOutReason } | null)?.reason;

  if (session) return <Navigate to={next} replace />;
  return (
    <AuthCard title={forgot ? 'Reset your password' : 'Sign in'} titleId="sign-in-title">
      {reason === 'expired' ? (
        <p role="status" className="rounded-md bg-amber-50 px-3 py-2 text-sm text-ink-900">
          Your session has ended. Sign in again to continue where you were.
        </p>
      ) : null}
      {forgot ? (
        <>
          <ForgotPasswordForm />
          <button type="button" className="text-sm text-ink-700 underline" onClick={() => setForgot(false)}>
            Back to sign-in
          </button>
        </>
      ) : (
        <>
          <SignInForm onSignedIn={() => void navigate(next, { replace: true })} />
          <div className="flex justify-between text-sm">
            <button type="button" className="text-ink-700 underline" onClick={() => setForgot(true)}>
              Forgot your password?
            </button>
          </div>
        </>
      )}
    </AuthCard>
  );
}
