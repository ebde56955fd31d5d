import type { App } from 'vue'
import { Notify } from 'quasar'
import { connectSession } from '../api/client'
import { useAuthStore } from '../features/auth/store'
import { router } from '../router'

/** Lets the API client read and renew the session held in the auth store. */
export function install(_app: App): void {
  connectSession({
    accessToken: () => useAuthStore().accessToken,
    refreshed: (session) => useAuthStore().applySession(session),
    expired: () => {
      const wasSignedIn = useAuthStore().isSignedIn
      useAuthStore().clearSession()
      const current = router.currentRoute.value
      if (current.name === 'signin') return
      if (wasSignedIn) Notify.create({ type: 'warning', message: 'Your session has ended. Sign in again to continue.' })
      void router.replace({ name: 'signin', query: { redirect: current.fullPath } })
    },
  })
}
