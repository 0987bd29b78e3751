import nodemailer, { type Transporter } from "nodemailer";
import { env, isProduction } from "@/lib/env";

/**
 * SMTP transport: the SMTP_URL server in production, the local catcher on
 * 127.0.0.1 in demo mode and tests.
 */
export function createMailTransport(): Transporter {
  if (env.SMTP_URL) return nodemailer.createTransport(env.SMTP_URL);
  if (isProduction) throw new Error("SMTP_URL is required in production mode");
  return nodemailer.createTransport({ host: "127.0.0.1", port: env.MAIL_CATCHER_PORT, secure: false, ignoreTLS: true, connectionTimeout: 5000, greetingTimeout: 5000 });
}
