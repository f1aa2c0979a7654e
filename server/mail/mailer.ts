import nodemailer from 'nodemailer';
import type { ServerConfig } from '../config';
import { mailUnavailable } from '../errors';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

/** Sends through SMTP: the local mail sink in development and tests, the lab's server in use. */
export function createMailer(smtp: ServerConfig['smtp']): Mailer {
  const transport = nodemailer.createTransport({
    host: smtp.host,
    port: smtp.port,
    secure: false,
    ignoreTLS: smtp.host === '127.0.0.1' || smtp.host === 'localhost',
    connectionTimeout: 5_000,
    greetingTimeout: 5_000,
  });
  return {
    async send(mail) {
      try {
        await transport.sendMail({ from: smtp.from, ...mail });
      } catch {
        throw mailUnavailable();
      }
    },
    close: () => transport.close(),
  };
}
