import nodemailer, { type Transporter } from 'nodemailer';

export interface OutgoingMessage {
  to: string;
  subject: string;
  text: string;
  html?: string;
}

export interface Mailer {
  send(message: OutgoingMessage): Promise<void>;
}

/** Sends through any SMTP server named by an smtp:// or smtps:// URL (the local fake in development, demo and tests). */
export function createSmtpMailer(smtpUrl: string, from: string): Mailer {
  const transport: Transporter = nodemailer.createTransport(smtpUrl);
  return {
    async send(message) {
      await transport.sendMail({ from, ...message });
    },
  };
}
