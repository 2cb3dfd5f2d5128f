import type { Role } from '@shared/schemas/auth.schema';
import type { OutgoingMail } from './mailer';

const ROLE_WORDS: Record<Role, string> = {
  head_coach: 'head coach',
  coach: 'coach',
  athlete: 'athlete',
  guardian: 'guardian',
  analyst: 'analyst',
};

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

export function passwordResetMail(opts: {
  to: string;
  link: string;
  expiresInMinutes: number;
}): OutgoingMail {
  const text = [
    'Someone asked to reset the password of your Stanceline account.',
    '',
    `Choose a new password: ${opts.link}`,
    '',
    `The link works once, for ${opts.expiresInMinutes} minutes. If you did not ask for it, ignore this e-mail: your password stays as it is.`,
  ].join('\n');
  const html = [
    '<p>Someone asked to reset the password of your Stanceline account.</p>',
    `<p><a href="${escapeHtml(opts.link)}">Choose a new password</a></p>`,
    `<p>The link works once, for ${opts.expiresInMinutes} minutes. If you did not ask for it, ignore this e-mail: your password stays as it is.</p>`,
  ].join('\n');
  return { to: opts.to, subject: 'Reset your Stanceline password', text, html };
}

export function invitationMail(opts: {
  to: string;
  link: string;
  clubName: string;
  inviterName: string;
  role: Role;
  athleteName: string | null;
  expiresAt: Date;
}): OutgoingMail {
  const as =
    opts.role === 'guardian' && opts.athleteName
      ? `as a guardian of ${opts.athleteName}`
      : `as ${opts.role === 'athlete' || opts.role === 'analyst' ? 'an' : 'a'} ${ROLE_WORDS[opts.role]}`;
  const until = opts.expiresAt.toISOString().slice(0, 10);
  const text = [
    `${opts.inviterName} invited you to ${opts.clubName} on Stanceline ${as}.`,
    '',
    `Choose a password to join: ${opts.link}`,
    '',
    `The link works until ${until}. If you did not expect this e-mail, you can ignore it.`,
  ].join('\n');
  const html = [
    `<p>${escapeHtml(opts.inviterName)} invited you to <strong>${escapeHtml(opts.clubName)}</strong> on Stanceline ${escapeHtml(as)}.</p>`,
    `<p><a href="${escapeHtml(opts.link)}">Choose a password to join</a></p>`,
    `<p>The link works until ${until}. If you did not expect this e-mail, you can ignore it.</p>`,
  ].join('\n');
  return { to: opts.to, subject: `Join ${opts.clubName} on Stanceline`, text, html };
}
