// Mail through nodemailer over SMTP; in development the SMTP fake writes each message to .data/outbox.
import nodemailer, { type Transporter } from "nodemailer";
import { env } from "./env.server";

let transport: Transporter | undefined;

export async function sendMail(message: { to: string[]; subject: string; text: string }): Promise<void> {
  if (message.to.length === 0) return;
  transport ??= nodemailer.createTransport(env().SMTP_URL);
  await transport.sendMail({ from: env().MAIL_FROM, to: message.to, subject: message.subject, text: message.text });
}
