import nodemailer from "nodemailer";

export type MailTransport = {
  send(msg: {
    from: string;
    to: string;
    subject: string;
    text: string;
    html: string;
    attachments: { filename: string; contentType: string; content: Buffer }[];
  }): Promise<void>;
};

/** SMTP without TLS: the local catcher in development, a relay on the host in production. */
export function smtpTransport(host: string, port: number): MailTransport {
  const transporter = nodemailer.createTransport({
    host,
    port,
    secure: false,
    ignoreTLS: true,
    connectionTimeout: 5000,
    greetingTimeout: 5000,
  });
  return {
    async send(msg) {
      await transporter.sendMail(msg);
    },
  };
}
