import type { z } from 'zod'

interface FormOptions<S extends z.ZodType, R> {
  schema: S | (() => S)
  initial: () => z.input<S>
  submit: (data: z.output<S>) => Promise<R>
  onSuccess?: (result: R, data: z.output<S>) => unknown
  fallbackError?: string
}

/** Maps zod issues to one message per top-level field (the first issue wins). */
export function issuesToFields(issues: readonly z.core.$ZodIssue[]): Record<string, string> {
  const fields: Record<string, string> = {}
  for (const issue of issues) {
    const key = issue.path.length > 0 ? String(issue.path[0]) : '_form'
    fields[key] ??= issue.message
  }
  return fields
}

/**
 * A form checked by a shared zod schema first in the browser, then by the server; server field
 * errors (`data.fields`) land on the same fields, anything else in `formError`.
 */
export function useForm<S extends z.ZodType, R = unknown>(options: FormOptions<S, R>) {
  const schemaOf = (): S => typeof options.schema === 'function' ? options.schema() : options.schema

  const values = reactive(options.initial() as object) as z.input<S>
  const errors = ref<Record<string, string>>({})
  const formError = ref('')
  const pending = ref(false)
  const attempted = ref(false)

  function validate(): z.output<S> | undefined {
    const result = schemaOf().safeParse(values)
    if (result.success) {
      errors.value = {}
      return result.data
    }
    errors.value = issuesToFields(result.error.issues)
    const known = Object.keys(values as object)
    formError.value = Object.entries(errors.value).filter(([key]) => !known.includes(key)).map(([, message]) => message).join(' ')
    return undefined
  }

  /** After a first attempt, re-checks one field as the user corrects it. */
  function touch(field: string) {
    if (!attempted.value || !errors.value[field]) return
    const result = schemaOf().safeParse(values)
    const next: Record<string, string> = result.success ? {} : issuesToFields(result.error.issues)
    const rest = Object.fromEntries(Object.entries(errors.value).filter(([key]) => key !== field))
    errors.value = next[field] ? { ...rest, [field]: next[field] } : rest
  }

  // Re-check as the user types rather than on blur: an error vanishing on blur moves the
  // layout under the pointer between mousedown and mouseup, and the click lands elsewhere.
  // Only fields that changed: a server's error on another field stays until that field changes.
  const snapshotOf = () => Object.fromEntries(Object.entries(values as object).map(([key, value]) => [key, JSON.stringify(value)]))
  let snapshot = snapshotOf()
  watch(snapshotOf, (next) => {
    for (const [field, value] of Object.entries(next)) {
      if (value !== snapshot[field]) touch(field)
    }
    snapshot = next
  })

  async function focusFirstError(root: Element | null) {
    await nextTick()
    root?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus()
  }

  async function submit(event?: Event): Promise<R | undefined> {
    const root = event?.currentTarget instanceof Element ? event.currentTarget : null
    attempted.value = true
    formError.value = ''
    const data = validate()
    if (data === undefined) {
      await focusFirstError(root)
      return undefined
    }
    pending.value = true
    try {
      const result = await options.submit(data)
      attempted.value = false
      await options.onSuccess?.(result, data)
      return result
    }
    catch (err) {
      // Field errors for fields this form does not show (a link's token, say) are said above the form.
      const known = Object.keys(values as object)
      const fields = apiFieldErrors(err)
      const shown = Object.fromEntries(Object.entries(fields).filter(([key]) => known.includes(key)))
      const other = Object.entries(fields).filter(([key]) => !known.includes(key)).map(([, message]) => message)
      errors.value = shown
      formError.value = Object.keys(fields).length === 0
        ? apiErrorMessage(err, options.fallbackError)
        : other.join(' ')
      await focusFirstError(root)
      return undefined
    }
    finally {
      pending.value = false
    }
  }

  function reset(next?: z.input<S>) {
    Object.assign(values as object, next ?? options.initial())
    errors.value = {}
    formError.value = ''
    attempted.value = false
  }

  return reactive({ values, errors, formError, pending, validate, touch, submit, reset })
}
