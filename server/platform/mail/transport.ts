import nodemailer, { type Transporter } from 'nodemailer';

/** A nodemailer SMTP transport: the configured SMTP_URL, or the local fake (no TLS). */
export function createSmtpTransport(target: { url: string; localFake: boolean }): Transporter {
  if (target.localFake) {
    const u = new URL(target.url);
    return nodemailer.createTransport({
      host: u.hostname,
      port: Number(u.port),
      secure: false,
      ignoreTLS: true,
      connectionTimeout: 5_000,
      greetingTimeout: 5_000,
      socketTimeout: 10_000,
    });
  }
  return nodemailer.createTransport(target.url);
}
