import { computed, ref } from 'vue'
import { defineStore } from 'pinia'
import { refreshSession } from '../../api/client'
import type { SessionResponse, SignInRequest, SignUpRequest, UnitSystem, User } from '../../../shared/schemas/index'
import { useWorkspacesStore } from '../workspaces/store'
import * as authApi from './api'

export const useAuthStore = defineStore('auth', () => {
  const user = ref<User | null>(null)
  // Memory only: a token in storage would outlive the tab and be readable by any injected script.
  const accessToken = ref<string | null>(null)

  const isSignedIn = computed(() => user.value !== null && accessToken.value !== null)
  const unitSystem = computed<UnitSystem>(() => user.value?.unitSystem ?? 'mm')

  function applySession(session: SessionResponse): void {
    accessToken.value = session.accessToken
    user.value = session.user
  }

  /** Forgets the person here, including their workspace list, so the next person starts clean. */
  function clearSession(): void {
    accessToken.value = null
    user.value = null
    useWorkspacesStore().reset()
  }

  function setUser(next: User): void {
    user.value = next
  }

  let restoring: Promise<void> | null = null

  /**
   * Resumes a session from the refresh cookie once per page load; navigation waits for it so
   * guards decide with the real answer. An unreachable server leaves the person signed out.
   */
  function restore(): Promise<void> {
    restoring ??= refreshSession()
      .then((session) => {
        if (session) applySession(session)
        else clearSession()
      })
      .catch((error: unknown) => {
        console.warn('Could not resume the session', error)
        clearSession()
      })
    return restoring
  }

  async function signIn(credentials: SignInRequest): Promise<User> {
    const session = await authApi.signIn(credentials)
    applySession(session)
    return session.user
  }

  async function signUp(details: SignUpRequest): Promise<User> {
    const session = await authApi.signUp(details)
    applySession(session)
    return session.user
  }

  /** Ends the session here even when the server can't be told: the person asked to leave. */
  async function signOut(): Promise<void> {
    try {
      await authApi.signOut()
    } catch (error) {
      console.warn('Sign-out request failed; clearing the session locally', error)
    } finally {
      clearSession()
    }
  }

  return { user, accessToken, isSignedIn, unitSystem, applySession, clearSession, setUser, restore, signIn, signUp, signOut }
})
