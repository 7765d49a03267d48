import nodemailer from 'nodemailer'
import type { Transporter } from 'nodemailer'

let transporter: Transporter | undefined

function useTransporter(): Transporter {
  if (!transporter) {
    const { mail } = useRuntimeConfig()
    transporter = nodemailer.createTransport({
      host: mail.host,
      port: Number(mail.port),
      secure: String(mail.secure) === 'true',
      auth: mail.user ? { user: mail.user, pass: mail.pass } : undefined,
      pool: true,
    })
  }
  return transporter
}

export interface MailMessage {
  to: string
  subject: string
  text: string
  html?: string
  headers?: Record<string, string>
  attachments?: { filename: string, content: Buffer | Uint8Array, contentType: string, cid?: string }[]
}

export async function sendMail(message: MailMessage) {
  const { mail } = useRuntimeConfig()
  const attachments = message.attachments?.map(a => ({ ...a, content: Buffer.from(a.content) }))
  await useTransporter().sendMail({ from: mail.from, ...message, attachments })
}

export function appLink(path: string): string {
  return new URL(path, useRuntimeConfig().appUrl).toString()
}
