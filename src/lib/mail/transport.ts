import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { serverEnv } from '../env';

/**
 * The SMTP transport. Locally it talks to the stand-in that `npm start` runs on loopback; setting
 * SMTP_HOST (and SMTP_PORT, SMTP_SECURE, SMTP_USER, SMTP_PASSWORD) sends through a real relay.
 */
let transporter: Transporter | undefined;

function getTransporter(): Transporter {
  if (!transporter) {
    const env = serverEnv();
    transporter = nodemailer.createTransport({
      host: env.SMTP_HOST,
      port: env.SMTP_PORT,
      secure: env.SMTP_SECURE,
      auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? '' } : undefined,
      // Fail fast: a stalled relay must not hold a request (and its transaction) open.
      connectionTimeout: 5000,
      greetingTimeout: 5000,
      socketTimeout: 10000,
    });
  }
  return transporter;
}

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

export async function sendMail(mail: OutgoingMail): Promise<void> {
  await getTransporter().sendMail({ from: serverEnv().MAIL_FROM, ...mail });
}
