import type { App } from 'vue'
import '@fontsource/noto-sans/400.css'
import '@fontsource/noto-sans/500.css'
import '@fontsource/noto-sans/700.css'

// Fonts are bundled from npm so the app works offline and loads nothing from a CDN.
export function install(_app: App): void {}
