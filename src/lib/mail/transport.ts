import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { serverEnv } from '../env';

/**
 * The SMTP transport. Locally it talks to the stand-in that `npm start` runs on loopback; setting
 * SMTP_HOST (and SMTP_PORT, SMTP_SECURE, SMTP_USER, SMTP_PASSWORD) sends through a real relay.
 * Only the outbox dispatcher (outbox.ts) calls sendMail: business writes enqueue their mail instead.
 */
let transporter: Transporter | undefined;

/** A relay chosen by a test (plain SMTP, no auth), in place of the SMTP_* settings. */
let override: { host: string; port: number } | null = null;

/** Points the transport at another relay (tests: a stopped or freshly started stand-in); null goes back to SMTP_*. */
export function setMailTransportConfig(config: { host: string; port: number } | null): void {
  override = config;
  transporter?.close();
  transporter = undefined;
}

function getTransporter(): Transporter {
  if (!transporter) {
    const env = serverEnv();
    const target = override
      ? { host: override.host, port: override.port, secure: false, auth: undefined }
      : {
          host: env.SMTP_HOST,
          port: env.SMTP_PORT,
          secure: env.SMTP_SECURE,
          auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? '' } : undefined,
        };
    transporter = nodemailer.createTransport({
      ...target,
      // Fail fast: a stalled relay must not hold up the dispatcher's batch (and its claim's lease).
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
