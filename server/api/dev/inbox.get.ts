import { sql } from 'drizzle-orm'

interface InboxMessage { id: string, from: string, to: string[], subject: string, date: string, text: string, html: string }

// Only where the fake inbox runs (start and test commands). Production leaves devInboxUrl
// empty, and then this route does not exist as far as any caller can tell.
export default defineEventHandler(async (event) => {
  const { devInboxUrl } = useRuntimeConfig()
  if (!devInboxUrl) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Not found' })
  const user = await requireUser(event)
  const [admin] = await useDb().select({ clubId: schema.memberships.clubId }).from(schema.memberships)
    .where(sql`${schema.memberships.userId} = ${user.id} and 'admin' = any(${schema.memberships.roles})`).limit(1)
  if (!admin) throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'This needs the Admin role' })
  const inbox = await $fetch<{ messages: InboxMessage[] }>('/messages', { baseURL: devInboxUrl }).catch(() => {
    throw createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: 'The development inbox is not running' })
  })
  return { messages: inbox.messages }
})
