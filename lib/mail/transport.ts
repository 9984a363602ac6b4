import "server-only";
import nodemailer from "nodemailer";
import type { SendMailOptions } from "nodemailer";
import { mailSettings } from "./config";

/** `from` is the product's own sender unless a message names the shop it speaks for (lib/mail/format.ts shopSenderAddress). */
export type OutgoingMessage = Pick<SendMailOptions, "to" | "subject" | "html" | "text" | "attachments" | "messageId" | "headers" | "from" | "replyTo">;

/**
 * Sends one message over SMTP with the current settings: plain SMTP on loopback (maildev),
 * TLS and credentials in production when SMTP_SECURE / SMTP_USER / SMTP_PASSWORD are set.
 * One connection per message: the queue sends a handful a minute, not thousands.
 */
export async function sendMessage(message: OutgoingMessage): Promise<{ messageId: string; response: string }> {
  const s = mailSettings();
  const timeout = s.smtpTimeoutSeconds * 1000;
  const transport = nodemailer.createTransport({
    host: s.smtpHost,
    port: s.smtpPort,
    secure: s.smtpSecure,
    auth: s.smtpUser ? { user: s.smtpUser, pass: s.smtpPassword ?? "" } : undefined,
    // loopback stand-ins speak no TLS; a real provider gets STARTTLS when it offers it
    ignoreTLS: !s.smtpSecure && !s.smtpUser,
    connectionTimeout: timeout,
    greetingTimeout: timeout,
    socketTimeout: timeout,
  });
  try {
    const info = await transport.sendMail({ ...message, from: message.from ?? s.from });
    return { messageId: info.messageId, response: info.response };
  } finally {
    transport.close();
  }
}
