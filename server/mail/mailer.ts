import nodemailer from 'nodemailer';

export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

/** nodemailer over SMTP, for production servers and the embedded local one alike. */
export function createMailer(smtpUrl: string, from: string, options: { local: boolean }): Mailer {
  const url = new URL(smtpUrl);
  const secure = url.protocol === 'smtps:';
  const transport = nodemailer.createTransport({
    host: url.hostname,
    port: url.port ? Number(url.port) : secure ? 465 : 587,
    secure,
    auth: url.username ? { user: decodeURIComponent(url.username), pass: decodeURIComponent(url.password) } : undefined,
    // The embedded catcher on loopback offers no TLS; real servers must.
    ignoreTLS: options.local,
    requireTLS: !options.local && !secure,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from, ...mail });
    },
    close() {
      transport.close();
    },
  };
}
