// The renderer is built by Vite from renderer/; the same build runs in the
// desktop shell and, through `npm run web`, in an ordinary browser.
import { defineConfig } from 'vite';
import { svelte } from '@sveltejs/vite-plugin-svelte';

export default defineConfig({
  root: 'renderer',
  base: './',
  plugins: [svelte()],
  worker: { format: 'es' },
  build: {
    outDir: '../dist/renderer',
    emptyOutDir: true,
    chunkSizeWarningLimit: 6000,
  },
  server: { port: 5173, strictPort: false },
});
