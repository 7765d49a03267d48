import { expect, type Page } from '@playwright/test'

export const DEMO_CLUB = 'saltmarsh-sword-guild'
export const INBOX_URL = process.env.FAKE_INBOX_URL ?? 'http://127.0.0.1:2590'

// The demo sign-ins (server/database/seed/demo.ts), one per role.
export const demo = {
  admin: { email: 'admin@saltmarsh.example', password: 'saltmarsh-admin' },
  organizer: { email: 'organizer@saltmarsh.example', password: 'saltmarsh-organizer' },
  scorekeeper: { email: 'table@saltmarsh.example', password: 'saltmarsh-table' },
  streamer: { email: 'stream@saltmarsh.example', password: 'saltmarsh-stream' },
  commentator: { email: 'commentary@saltmarsh.example', password: 'saltmarsh-commentary' },
  editor: { email: 'editor@saltmarsh.example', password: 'saltmarsh-editor' },
  otherClubAdmin: { email: 'admin@ironquay.example', password: 'ironquay-admin' },
} as const

export async function signIn(page: Page, who: { email: string, password: string }) {
  await page.goto('/sign-in')
  // Fill the form once the app has taken the page over: on a busy machine a click before that
  // submits the bare server-rendered form and the page comes back empty.
  await page.waitForFunction(() => Boolean((document.querySelector('#__nuxt') as { __vue_app__?: unknown } | null)?.__vue_app__))
  await page.getByLabel('E-mail').fill(who.email)
  await page.getByLabel('Password').fill(who.password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page).toHaveURL(/\/clubs(\/|$)/)
}

export async function waitForMail(to: string, timeoutMs = 10_000) {
  const until = Date.now() + timeoutMs
  for (;;) {
    const res = await fetch(`${INBOX_URL}/messages`)
    const { messages } = await res.json() as { messages: { to: string[], subject: string, text: string }[] }
    const found = messages.find(m => m.to.includes(to))
    if (found) return found
    if (Date.now() > until) throw new Error(`no mail to ${to}`)
    await new Promise(r => setTimeout(r, 200))
  }
}
