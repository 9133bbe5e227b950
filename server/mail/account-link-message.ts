/** The words of the invitation and password-reset e-mails, in plain text and HTML. */
import type { AccountLinkPurpose } from '../../shared/api/account-links.js';
import type { Role } from '../../shared/api/auth.js';
import type { OutgoingMail } from '../services/mail/send-mail.js';

/** What the message says, besides the link. */
export interface AccountLinkMessageInput {
  purpose: AccountLinkPurpose;
  recipient: { email: string; name: string; role: Role };
  /** The admin who sent it. */
  sender: { name: string; email: string };
  /** The whole set-password address, token included. */
  link: string;
  expiresAt: Date;
}

/** The set-password address for `token` under `publicUrl` (a trailing slash is ignored). */
export function setPasswordLink(publicUrl: string, token: string): string {
  return `${publicUrl.replace(/\/+$/, '')}/set-password?token=${encodeURIComponent(token)}`;
}

/** The e-mail for an invitation or a password reset. */
export function accountLinkMessage(input: AccountLinkMessageInput): OutgoingMail {
  const { recipient, sender, link } = input;
  const until = `${input.expiresAt.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
  const invitation = input.purpose === 'invitation';
  const subject = invitation ? 'You are invited to Shelfmatch' : 'Set a new Shelfmatch password';
  const opening = invitation
    ? `${sender.name} (${sender.email}) has given you a Shelfmatch account with the ${recipient.role} role. Choose your password to sign in:`
    : `${sender.name} (${sender.email}) has sent you a link to choose a new Shelfmatch password:`;
  const closing = invitation
    ? 'You will sign in with this e-mail address and the password you choose.'
    : 'Your current password keeps working until you choose a new one. If you did not ask for this, tell your admin.';
  const rule = `The link works once and until ${until}.`;

  const text = [`Hello ${recipient.name},`, '', opening, '', link, '', rule, closing, '', 'Shelfmatch'].join('\n');
  const html = [
    `<p>Hello ${escapeHtml(recipient.name)},</p>`,
    `<p>${escapeHtml(opening)}</p>`,
    `<p><a href="${escapeHtml(link)}">${invitation ? 'Choose your password' : 'Choose a new password'}</a></p>`,
    `<p>${escapeHtml(rule)} ${escapeHtml(closing)}</p>`,
    `<p>If the link does not open, copy this address into your browser:<br>${escapeHtml(link)}</p>`,
    '<p>Shelfmatch</p>',
  ].join('\n');
  return { to: recipient.email, subject, text, html };
}

/** `value` with the five HTML-special characters written as entities. */
function escapeHtml(value: string): string {
  return value.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}
