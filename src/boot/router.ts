import type { App } from 'vue'
import { router } from '../router'

export function install(app: App): void {
  app.use(router)
}
