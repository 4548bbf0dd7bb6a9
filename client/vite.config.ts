import { fileURLToPath } from 'node:url';
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));
const appPort = Number(process.env.CUTLINE_APP_PORT ?? process.env.CUTLINE_PORT_BASE ?? 4600);

export default defineConfig({
  root: here('.'),
  plugins: [react(), tailwindcss()],
  resolve: {
    alias: { '@shared': here('../shared'), '@': here('./src') },
  },
  build: {
    outDir: here('../dist/client'),
    emptyOutDir: true,
    sourcemap: false,
    chunkSizeWarningLimit: 900,
  },
  server: {
    fs: { allow: [here('..')] },
    // `npm run dev:client` serves the client with hot reload and forwards the API to `npm start`.
    proxy: { '/api': `http://127.0.0.1:${appPort}`, '/auth': `http://127.0.0.1:${appPort}` },
  },
});
