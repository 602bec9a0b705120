import nodemailer, { type Transporter } from 'nodemailer';

/** One nodemailer SMTP transport: the local fake outside production, the relay in it. */
export function createTransport(smtpUrl: string): Transporter {
  return nodemailer.createTransport({
    url: smtpUrl,
    connectionTimeout: 10_000,
    socketTimeout: 20_000,
  });
}
