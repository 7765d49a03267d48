import type { H3Event } from 'h3'
import type { z } from 'zod'

/** Turns zod issues into a 400 whose message names each field, e.g. "email: Enter a valid e-mail address". */
export function badRequest(issues: readonly z.core.$ZodIssue[], where: string) {
  const fields: Record<string, string> = {}
  for (const issue of issues) {
    const path = issue.path.map(String).join('.') || where
    fields[path] ??= issue.code === 'unrecognized_keys'
      ? `Unknown field${issue.keys.length > 1 ? 's' : ''}: ${issue.keys.join(', ')}`
      : issue.message
  }
  return fieldsError(400, fields)
}

/** An error about named fields, in the same shape as a validation failure. */
export function fieldError(status: 400 | 409, field: string, text: string) {
  return fieldsError(status, { [field]: text })
}

function fieldsError(statusCode: number, fields: Record<string, string>) {
  const message = Object.entries(fields).map(([field, text]) => `${field}: ${text}`).join('; ')
  return createError({ statusCode, statusMessage: statusCode === 409 ? 'Conflict' : 'Bad Request', message, data: { fields } })
}

function parseWith<S extends z.ZodType>(schema: S, value: unknown, where: string): z.infer<S> {
  const result = schema.safeParse(value)
  if (!result.success) throw badRequest(result.error.issues, where)
  return result.data
}

export async function validBody<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.infer<S>> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!type.toLowerCase().startsWith('application/json')) {
    throw createError({ statusCode: 415, statusMessage: 'Unsupported Media Type', message: 'body: send JSON with Content-Type: application/json' })
  }
  let body: unknown
  try {
    body = await readBody(event)
  }
  catch {
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'body: not valid JSON' })
  }
  return parseWith(schema, body ?? {}, 'body')
}

export function validParams<S extends z.ZodType>(event: H3Event, schema: S): z.infer<S> {
  return parseWith(schema, getRouterParams(event, { decode: true }), 'params')
}

export function validQuery<S extends z.ZodType>(event: H3Event, schema: S): z.infer<S> {
  return parseWith(schema, getQuery(event), 'query')
}

/** A form's body (URL-encoded or multipart), as a plain form or a mail client posts it: text fields only. */
export async function validFormBody<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.infer<S>> {
  const type = (getRequestHeader(event, 'content-type') ?? '').toLowerCase()
  if (!type.startsWith('application/x-www-form-urlencoded') && !type.startsWith('multipart/form-data')) {
    throw createError({ statusCode: 415, statusMessage: 'Unsupported Media Type', message: 'body: send a form (application/x-www-form-urlencoded or multipart/form-data)' })
  }
  let form: FormData
  try {
    form = await readFormData(event)
  }
  catch {
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'body: not a valid form' })
  }
  const fields: Record<string, string> = {}
  for (const [key, value] of form.entries()) if (typeof value === 'string') fields[key] ??= value
  return parseWith(schema, fields, 'body')
}

/** A browser's form post (it wants a page back) rather than a program's request. */
export function wantsHtml(event: H3Event): boolean {
  return (getRequestHeader(event, 'accept') ?? '').includes('text/html')
}
