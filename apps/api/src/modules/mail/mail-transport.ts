import nodemailer, { type Transporter } from 'nodemailer';
import { config } from '../../config';

export interface MailServer {
  host: string;
  port: number;
  secure: boolean;
  user?: string;
  password?: string;
}

/** SMTP transport; maildev locally, a real relay by configuration alone. */
export function createMailTransport(server: MailServer = config.mail): Transporter {
  return nodemailer.createTransport({
    host: server.host,
    port: server.port,
    secure: server.secure,
    auth: server.user ? { user: server.user, pass: server.password } : undefined,
    connectionTimeout: 5000,
    greetingTimeout: 5000,
    socketTimeout: 10000,
    // Locally the catcher speaks plain SMTP; STARTTLS is used whenever a real relay offers it.
    ignoreTLS: !server.secure && server.host === '127.0.0.1',
  });
}
