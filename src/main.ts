import { createApp } from 'vue'
import App from './App.vue'
import { install as installFonts } from './boot/fonts'
import { install as installQuasar } from './boot/quasar'
import { install as installPinia } from './boot/pinia'
import { install as installSession } from './boot/session'
import { install as installRouter } from './boot/router'

const app = createApp(App)
// Order matters: stores exist before the session hooks use them, and the router's first guard runs last.
for (const install of [installFonts, installQuasar, installPinia, installSession, installRouter]) install(app)
app.mount('#app')
