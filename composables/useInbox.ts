export interface InboxMessage {
  id: string | number
  from: string
  to: string[]
  subject: string
  date: string
  text: string
  html: string | null
}

export function useInbox() {
  return useFetch<{ messages: InboxMessage[] }>('/api/dev/inbox', {
    key: 'dev-inbox',
    transform: response => ({
      messages: [...response.messages].sort((a, b) => Date.parse(b.date) - Date.parse(a.date)),
    }),
  })
}
