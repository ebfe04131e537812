import { fileURLToPath } from 'node:url';
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

/** The Express server the dev server forwards API and socket traffic to (`PORT`, default 8080). */
const API_ORIGIN = `http://127.0.0.1:${process.env.PORT ?? 8080}`;

export default defineConfig({
  root: fileURLToPath(new URL('./client', import.meta.url)),
  plugins: [react(), tailwindcss()],
  resolve: { alias: { '@shared': fileURLToPath(new URL('./shared', import.meta.url)) } },
  build: {
    outDir: '../dist/client',
    emptyOutDir: true,
    rolldownOptions: {
      output: {
        // Libraries change far less often than the app: separate chunks stay cached across releases.
        codeSplitting: {
          groups: [
            { name: 'react', test: /node_modules[\\/](react|react-dom|react-router|scheduler)[\\/]/ },
            { name: 'vendor', test: /node_modules[\\/]/ },
          ],
        },
      },
    },
  },
  server: {
    host: '127.0.0.1',
    port: Number(process.env.SSCOPE_DEV_PORT ?? 5173),
    strictPort: true,
    proxy: {
      '/api': API_ORIGIN,
      '/socket.io': { target: API_ORIGIN, ws: true },
    },
  },
});
