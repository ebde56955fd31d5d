import { computed, ref } from 'vue'
import { defineStore } from 'pinia'
import type { ClientConfig } from '../../../shared/schemas/index'
import { fetchClientConfig } from './api'

/** What the server says about itself; read once per page load. */
export const useConfigStore = defineStore('config', () => {
  const config = ref<ClientConfig | null>(null)
  const outboxEnabled = computed(() => config.value?.outboxEnabled === true)
  const version = computed(() => config.value?.version ?? null)

  let loading: Promise<void> | null = null

  function load(): Promise<void> {
    loading ??= fetchClientConfig()
      .then((answer) => {
        config.value = answer
      })
      .catch((error: unknown) => {
        // Without the config the app still works; only development extras stay hidden.
        console.warn('Could not read the server configuration', error)
        loading = null
      })
    return loading
  }

  return { config, outboxEnabled, version, load }
})
