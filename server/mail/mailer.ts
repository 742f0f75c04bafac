import nodemailer, { type Transporter } from 'nodemailer';
import type { Config } from '../config.ts';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
}

/** Sends the product's e-mail (invitations, password resets) through SMTP. */
export class Mailer {
  private readonly transport: Transporter;

  constructor(private readonly from: string, transport: Transporter) {
    this.transport = transport;
  }

  static fromConfig(config: Config): Mailer {
    const transport = nodemailer.createTransport({
      host: config.SMTP_HOST,
      port: config.SMTP_PORT,
      secure: config.SMTP_SECURE,
      ignoreTLS: !config.SMTP_SECURE,
    });
    return new Mailer(config.MAIL_FROM, transport);
  }

  async send(mail: OutgoingMail): Promise<void> {
    await this.transport.sendMail({ from: this.from, ...mail });
  }

  async ping(): Promise<void> {
    await this.transport.verify();
  }

  close(): void {
    this.transport.close();
  }
}
