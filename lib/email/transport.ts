import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { mailFrom } from './config';
import type { MailMessage } from './messages';

const transports = new Map<string, Transporter>();

function transportFor(url: string): Transporter {
  let transport = transports.get(url);
  if (!transport) {
    // Short timeouts: a failed attempt goes back to the queue, which retries later.
    transport = nodemailer.createTransport({
      url,
      connectionTimeout: 10_000,
      greetingTimeout: 10_000,
      socketTimeout: 30_000,
    });
    transports.set(url, transport);
  }
  return transport;
}

/** Hands one message to the SMTP server at `url`; throws when it is not accepted. */
export async function deliverMail(url: string, message: MailMessage): Promise<void> {
  await transportFor(url).sendMail({
    from: mailFrom(),
    to: message.to,
    subject: message.subject,
    text: message.text,
    html: message.html,
  });
}
