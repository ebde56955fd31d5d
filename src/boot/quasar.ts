import type { App } from 'vue'
import { Quasar, Notify, Dialog, Loading } from 'quasar'
import '@quasar/extras/material-icons/material-icons.css'
import 'quasar/src/css/index.sass'
import '../styles/app.sass'

export function install(app: App): void {
  app.use(Quasar, {
    plugins: { Notify, Dialog, Loading },
    config: {
      notify: { position: 'top-right', timeout: 5000, actions: [{ icon: 'close', color: 'white', 'aria-label': 'Dismiss' }] },
      loading: { delay: 200 },
    },
  })
}
