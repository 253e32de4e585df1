import nodemailer from 'nodemailer';

export interface SmtpSettings {
  host: string;
  port: number;
  from: string;
}

/** Plain SMTP to the configured server (maildev locally and in tests). */
export function createTransport(smtp: SmtpSettings) {
  return nodemailer.createTransport({ host: smtp.host, port: smtp.port, secure: false, ignoreTLS: true, connectionTimeout: 5000 });
}
