import nodemailer, { type Transporter } from 'nodemailer';
import type SMTPTransport from 'nodemailer/lib/smtp-transport';
import type { CapturedMail } from '@toneledger/common/schemas/system';
import { capturedMailSchema } from '@toneledger/common/schemas/system';
import { z } from 'zod';
import { serviceUnavailable } from '../errors';

export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
}

export class Mailer {
  private readonly transport: Transporter;

  constructor(
    smtpUrl: string,
    private readonly from: string,
    private readonly sinkApi?: string,
  ) {
    const url = new URL(smtpUrl);
    const local = url.hostname === '127.0.0.1' || url.hostname === 'localhost';
    // The local sink speaks plain SMTP; a real relay negotiates TLS as its URL says.
    this.transport = nodemailer.createTransport({ url: smtpUrl, ...(local ? { ignoreTLS: true } : {}) } as SMTPTransport.Options);
  }

  async send(mail: OutgoingMail): Promise<{ messageId: string }> {
    try {
      const info = await this.transport.sendMail({ from: this.from, ...mail });
      return { messageId: info.messageId };
    } catch {
      throw serviceUnavailable('The mail server did not accept the message.');
    }
  }

  get hasSink(): boolean {
    return Boolean(this.sinkApi);
  }

  /** Messages caught by the local sink (development and tests only). */
  async captured(): Promise<CapturedMail[]> {
    if (!this.sinkApi) return [];
    let res: Response;
    try {
      res = await fetch(new URL('/messages', this.sinkApi), { signal: AbortSignal.timeout(3000) });
    } catch {
      throw serviceUnavailable('The local mail sink is not running.');
    }
    if (!res.ok) throw serviceUnavailable('The local mail sink did not answer.');
    return z.array(capturedMailSchema).parse(await res.json());
  }

  close(): void {
    this.transport.close();
  }
}
