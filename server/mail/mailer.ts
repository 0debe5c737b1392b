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

/**
 * Sends through any SMTP server named by an smtp:// or smtps:// URL (the
 * local fake in development, demo and tests). The timeouts stay well inside
 * the outbox worker's claim timeout, so a hung server fails the attempt
 * rather than outliving the claim.
 */
export function createSmtpMailer(smtpUrl: string, from: string): Mailer {
  const transport: Transporter = nodemailer.createTransport({ url: smtpUrl, connectionTimeout: 15_000, greetingTimeout: 15_000, socketTimeout: 60_000 });
  return {
    async send(message) {
      await transport.sendMail({ from, ...message });
    },
  };
}
