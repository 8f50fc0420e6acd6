import { useNavigate, useSearchParams } from 'react-router';
import { AuthCard } from '../../features/auth/components/auth-card';
import { AcceptInvitationForm } from '../../features/auth/components/password-forms';
import { paths } from '../../lib/paths';

/** `/accept-invitation?token=…` from the invitation e-mail: choose a name and password, then in. */
export default function AcceptInvitationPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const token = params.get('token');
  return (
    <AuthCard title="Join your organisation on Headroom" titleId="invite-title">
      {token ? (
        <AcceptInvitationForm token={token} onDone={() => void navigate(paths.home.href(), { replace: true })} />
      ) : (
        <p role="alert" className="text-sm text-verdict-over">
          This invitation link is incomplete. Open the link from the e-mail again, or ask your administrator for a new
          invitation.
        </p>
      )}
    </AuthCard>
  );
}
