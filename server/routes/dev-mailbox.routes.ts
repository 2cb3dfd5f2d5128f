import { Router, type RequestHandler } from 'express';
import { HttpError } from '../errors';
import type { Mailbox } from '../mail/embedded-smtp';

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** Only mounted while the embedded SMTP fake is in use: a small inbox page of every message sent. */
const LOOPBACK = new Set(['127.0.0.1', '::1', '::ffff:127.0.0.1']);

/** Headers a reverse proxy adds: behind one, every caller arrives from loopback. */
const PROXY_HEADERS = [
  'forwarded',
  'x-forwarded-for',
  'x-forwarded-host',
  'x-forwarded-proto',
  'x-real-ip',
  'via',
];

// The inbox holds invitation links, which are sign-ups: only the machine itself may read it, and a
// request that passed through a proxy is not the machine itself, whatever its socket address.
const loopbackOnly: RequestHandler = (req, _res, next) => {
  const proxied = PROXY_HEADERS.some((h) => req.headers[h] !== undefined);
  if (!proxied && LOOPBACK.has(req.socket.remoteAddress ?? '')) return next();
  next(new HttpError(404, 'not_found', 'Not found'));
};

export function devMailboxRoutes(mailbox: Mailbox): Router {
  const router = Router();
  router.use('/dev', loopbackOnly);

  router.get('/dev/mailbox.json', async (_req, res) => {
    res.json({ messages: await mailbox.messages() });
  });

  router.get('/dev/mailbox', async (_req, res) => {
    const messages = (await mailbox.messages()).reverse();
    const items = messages
      .map(
        (m) => `<article>
  <header><strong>${escapeHtml(m.subject)}</strong><br><small>to ${escapeHtml(m.to)} · ${escapeHtml(m.receivedAt)}</small></header>
  <pre>${escapeHtml(m.text).replace(/(https?:\/\/[^\s<]+)/g, '<a href="$1">$1</a>')}</pre>
</article>`,
      )
      .join('\n');
    res.type('html').send(`<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>Stanceline dev mailbox</title>
<style>body{font-family:system-ui,sans-serif;max-width:48rem;margin:2rem auto;padding:0 1rem;color:#1f2933}
article{border:1px solid #cbd2d9;border-radius:6px;padding:.75rem 1rem;margin:.75rem 0}pre{white-space:pre-wrap}</style>
</head><body><h1>Dev mailbox</h1><p>${messages.length} message(s) caught by the local SMTP stand-in; nothing left this machine.</p>
${items || '<p>No mail yet.</p>'}
</body></html>`);
  });

  return router;
}
