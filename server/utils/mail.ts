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
}

export async function sendMail(message: MailMessage) {
  const { mail } = useRuntimeConfig()
  await useTransporter().sendMail({ from: mail.from, ...message })
}

export function appLink(path: string): string {
  return new URL(path, useRuntimeConfig().appUrl).toString()
}
