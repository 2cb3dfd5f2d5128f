import nodemailer, { type Transporter } from 'nodemailer';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

/** One code path for every environment: nodemailer over SMTP, only the URL changes. */
export function createMailer(smtpUrl: string, from: string): Mailer {
  const url = new URL(smtpUrl);
  const local = url.hostname === '127.0.0.1' || url.hostname === 'localhost';
  const transport: Transporter = nodemailer.createTransport({
    url: smtpUrl,
    // The loopback fake speaks plain SMTP; real relays negotiate TLS as usual.
    ignoreTLS: local,
  } as nodemailer.TransportOptions);
  return {
    async send(mail) {
      await transport.sendMail({ from, ...mail });
    },
    close: () => transport.close(),
  };
}
