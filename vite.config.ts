import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vite'
import vue from '@vitejs/plugin-vue'
import { quasar, transformAssetUrls } from '@quasar/vite-plugin'

const apiPort = process.env.PORT ?? '5173'

export default defineConfig({
  plugins: [
    vue({ template: { transformAssetUrls } }),
    quasar({ sassVariables: fileURLToPath(new URL('./src/styles/quasar-variables.sass', import.meta.url)) }),
  ],
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./src', import.meta.url)),
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
    },
  },
  // `npm run dev:client` serves the client with hot reload on 5180 and sends /api to a running server.
  server: { host: '127.0.0.1', port: 5180, proxy: { '/api': `http://127.0.0.1:${apiPort}` } },
  build: { outDir: 'dist', chunkSizeWarningLimit: 1200 },
})
