import type { MailMessage } from './mailer.js';

/** Builds `<publicUrl>/<path>?token=…` (publicUrl may carry a base path). */
export function linkTo(publicUrl: string, pagePath: string, token: string): string {
  const url = new URL(publicUrl.replace(/\/?$/, '/') + pagePath.replace(/^\//, ''));
  url.searchParams.set('token', token);
  return url.toString();
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function message(to: string, subject: string, paragraphs: string[], link: { href: string; label: string }): MailMessage {
  const text = [...paragraphs.slice(0, 1), `${link.label}: ${link.href}`, ...paragraphs.slice(1)].join('\n\n') + '\n\n— Headroom\n';
  const html =
    paragraphs
      .slice(0, 1)
      .map((p) => `<p>${escapeHtml(p)}</p>`)
      .join('') +
    `<p><a href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a></p>` +
    paragraphs
      .slice(1)
      .map((p) => `<p>${escapeHtml(p)}</p>`)
      .join('') +
    '<p>— Headroom</p>';
  return { to, subject, text, html };
}

export function invitationMessage(p: { to: string; inviteeName: string; organisationName: string; invitedBy: string | null; link: string; expiresAt: Date }): MailMessage {
  return message(
    p.to,
    `You are invited to ${p.organisationName} on Headroom`,
    [
      `Hello ${p.inviteeName}, ${p.invitedBy ?? 'an admin'} has invited you to ${p.organisationName} on Headroom. Open the link to choose your password.`,
      `The link works once and expires at ${p.expiresAt.toISOString()}. If you did not expect this invitation, ignore this message.`,
    ],
    { href: p.link, label: 'Accept the invitation' },
  );
}

export function passwordResetMessage(p: { to: string; name: string; link: string; expiresAt: Date }): MailMessage {
  return message(
    p.to,
    'Reset your Headroom password',
    [
      `Hello ${p.name}, someone (we hope you) asked to reset your Headroom password. Open the link to choose a new one; setting it signs you out everywhere.`,
      `The link works once and expires at ${p.expiresAt.toISOString()}. If you did not ask for this, ignore this message: your password stays as it is.`,
    ],
    { href: p.link, label: 'Choose a new password' },
  );
}
