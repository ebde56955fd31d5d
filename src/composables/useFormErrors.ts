import { reactive } from 'vue'
import type { ZodType } from 'zod'
import { isApiError } from '../api/ApiError'
import { useNotice } from './useNotice'

/**
 * Field messages for one form. Checks input with the same zod schema the server uses, so a
 * person sees the same wording before and after a round trip; server field messages land under
 * the matching input and everything else becomes a notification.
 */
export function useFormErrors<Field extends string>(
  fieldNames: readonly Field[],
  /** Server field name → input name, where the form names an input differently from the API body. */
  serverNames: Partial<Record<string, Field>> = {},
) {
  const notice = useNotice()
  const errors = reactive({}) as Partial<Record<Field, string>>
  // A stale "wrong password" must not linger beside the result of the next attempt.
  let dismissNotice: (() => void) | null = null

  function showNotice(reason: unknown, fallback?: string): void {
    dismissNotice = notice.error(reason, fallback)
  }

  function isField(name: string): name is Field {
    return (fieldNames as readonly string[]).includes(name)
  }

  function clear(field?: Field): void {
    if (field) {
      delete errors[field]
      return
    }
    for (const name of fieldNames) delete errors[name]
  }

  /** Returns the parsed value, or null after putting each problem under its input. */
  function validate<T>(schema: ZodType<T>, value: unknown): T | null {
    clear()
    dismissNotice?.()
    dismissNotice = null
    const result = schema.safeParse(value)
    if (result.success) return result.data
    let unplaced: string | null = null
    for (const issue of result.error.issues) {
      const name = issue.path.join('.')
      if (isField(name)) errors[name] ??= issue.message
      else unplaced ??= issue.message
    }
    if (unplaced) showNotice(null, unplaced)
    return null
  }

  /** Shows a failed request: body field messages under inputs, the rest as a notification. */
  function handle(reason: unknown, fallback?: string): void {
    if (isApiError(reason)) {
      const placed = Object.entries(reason.bodyFieldMessages())
        .map(([name, message]) => [serverNames[name] ?? name, message] as const)
        .filter((entry): entry is readonly [Field, string] => isField(entry[0]))
      for (const [name, message] of placed) errors[name] = message
      if (placed.length > 0) return
    }
    showNotice(reason, fallback)
  }

  return { errors, clear, validate, handle }
}
