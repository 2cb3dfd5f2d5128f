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

/** A published review: the coach's summary, and a link into the app (or to set a password first). */
export function reviewMail(opts: {
  to: string;
  recipientName: string;
  athleteName: string;
  coachName: string;
  clubName: string;
  title: string;
  summary: string;
  link: string;
  /** The recipient has no password yet: the link sets one, then opens the review. */
  setsPassword: boolean;
  republished: boolean;
}): OutgoingMail {
  const whose = opts.recipientName === opts.athleteName ? 'your' : `${opts.athleteName}'s`;
  const intro = `${opts.coachName} of ${opts.clubName} ${opts.republished ? 'has corrected' : 'has shared'} a review of ${whose} training run: “${opts.title}”.`;
  const action = opts.setsPassword
    ? 'Choose a password for your Stanceline account, and the review opens'
    : 'Open the review';
  const caution =
    'The angles are 2D estimates from one camera: a coaching aid, not a medical or injury assessment.';
  const text = [
    `Hello ${opts.recipientName},`,
    '',
    intro,
    '',
    opts.summary,
    '',
    `${action}: ${opts.link}`,
    '',
    caution,
  ].join('\n');
  const html = [
    `<p>Hello ${escapeHtml(opts.recipientName)},</p>`,
    `<p>${escapeHtml(intro)}</p>`,
    `<blockquote style="border-left:3px solid #245178;margin:0;padding-left:12px">${escapeHtml(opts.summary).replace(/\n/g, '<br>')}</blockquote>`,
    `<p><a href="${escapeHtml(opts.link)}">${escapeHtml(action)}</a></p>`,
    `<p style="color:#555;font-size:12px">${escapeHtml(caution)}</p>`,
  ].join('\n');
  return {
    to: opts.to,
    subject: `${opts.republished ? 'Corrected review' : 'New review'} from ${opts.coachName}: ${opts.title}`,
    text,
    html,
  };
}

/** To the head coach, a week before the club's retention erases a past season's clips. */
export function retentionNoticeMail(opts: {
  to: string;
  recipientName: string;
  clubName: string;
  seasonName: string;
  erasesOn: string;
  clips: number;
  link: string;
}): OutgoingMail {
  const what = `${opts.clips} ${opts.clips === 1 ? 'clip' : 'clips'} of season ${opts.seasonName}`;
  const lines = [
    `${what} at ${opts.clubName} will be erased on ${opts.erasesOn}, as the club's retention setting says.`,
    'Frames, flags, notes and reviews of those clips go with them. Athletes and guardians can download their data before then from their Home page.',
    'To keep them longer, change how long clips are kept after a season ends:',
  ];
  const text = [
    `Hello ${opts.recipientName},`,
    '',
    ...lines.slice(0, 2),
    '',
    `${lines[2]} ${opts.link}`,
  ].join('\n');
  const html = [
    `<p>Hello ${escapeHtml(opts.recipientName)},</p>`,
    ...lines.slice(0, 2).map((l) => `<p>${escapeHtml(l)}</p>`),
    `<p><a href="${escapeHtml(opts.link)}">Change the retention setting</a></p>`,
  ].join('\n');
  return {
    to: opts.to,
    subject: `Clips of season ${opts.seasonName} will be erased on ${opts.erasesOn}`,
    text,
    html,
  };
}

/** To the head coach when a guardian or an adult athlete withdraws consent in the app. */
export function consentWithdrawnMail(opts: {
  to: string;
  recipientName: string;
  athleteName: string;
  decidedBy: string;
  erasesOn: string;
  link: string;
}): OutgoingMail {
  const body = `${opts.decidedBy} withdrew consent for ${opts.athleteName}. Their clips and reviews are hidden from everyone but you, and will be erased on ${opts.erasesOn} unless consent is restored before then.`;
  const text = [
    `Hello ${opts.recipientName},`,
    '',
    body,
    '',
    `The athlete's consent record: ${opts.link}`,
  ].join('\n');
  const html = [
    `<p>Hello ${escapeHtml(opts.recipientName)},</p>`,
    `<p>${escapeHtml(body)}</p>`,
    `<p><a href="${escapeHtml(opts.link)}">Open the athlete's consent record</a></p>`,
  ].join('\n');
  return { to: opts.to, subject: `Consent withdrawn for ${opts.athleteName}`, text, html };
}
