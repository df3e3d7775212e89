import nodemailer from 'nodemailer';
import type { Config } from '../config';
import { headerText } from './header-text';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  /** Where a reply goes (a report goes out from the product's address; replies reach the designer who sent it). */
  replyTo?: { name: string; address: string };
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

/** SMTP through nodemailer: the local sink in development and tests, the real relay in production. */
export function createMailer(config: Config): Mailer {
  const { smtp } = config;
  const transport = nodemailer.createTransport({
    host: smtp.host,
    port: smtp.port,
    secure: smtp.secure,
    ignoreTLS: !smtp.secure && config.env !== 'production',
    auth: smtp.user ? { user: smtp.user, pass: smtp.password ?? '' } : undefined,
    connectionTimeout: 10_000,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from: config.mailFrom, ...mail, subject: headerText(mail.subject, 200) });
    },
    close() {
      transport.close();
    },
  };
}
