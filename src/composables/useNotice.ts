import { useQuasar } from 'quasar'
import { isApiError } from '../api/ApiError'

/** Short-lived messages in the corner; for errors that belong to no single input. */
export function useNotice() {
  const $q = useQuasar()

  function success(message: string): void {
    $q.notify({ type: 'positive', message, icon: 'check_circle' })
  }

  function info(message: string): void {
    $q.notify({ type: 'info', message })
  }

  /** Returns a function that takes the message away, e.g. once the person has tried again. */
  function error(reason: unknown, fallback = 'Something went wrong. Try again.'): () => void {
    const message = isApiError(reason) ? reason.message : fallback
    if (reason instanceof Error && !isApiError(reason)) console.error(reason)
    return $q.notify({ type: 'negative', message, icon: 'error_outline' })
  }

  return { success, info, error }
}
