import nodemailer from 'nodemailer';
import type { Transporter } from 'nodemailer';
import { env } from '@/lib/env';

let transport: Transporter | null = null;

/** Sends one message through SMTP_URL (the local catcher in local mode). */
export async function sendMail(msg: { to: string; subject: string; text: string }) {
  transport ??= nodemailer.createTransport(env().SMTP_URL);
  await transport.sendMail({ from: env().MAIL_FROM, ...msg });
}
