import type { App } from 'vue'
import { createPinia } from 'pinia'

export function install(app: App): void {
  app.use(createPinia())
}
