import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

// The client is served by Vite in development and by the Express server from dist/ in
// production. Everything it needs (fonts, coastlines) is bundled: no request leaves the machine.
export default defineConfig({
  plugins: [react(), tailwindcss()],
  server: {
    host: '127.0.0.1',
    port: 5173,
    proxy: {
      '/api': { target: 'http://127.0.0.1:3000', changeOrigin: false },
    },
  },
  preview: {
    host: '127.0.0.1',
    proxy: {
      '/api': { target: 'http://127.0.0.1:3000', changeOrigin: false },
    },
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    sourcemap: true,
    // Screens are lazy routes and heavy libraries (coastlines, and later Plotly) are dynamic
    // imports, so the default chunking already keeps them out of the first screen's JavaScript.
    chunkSizeWarningLimit: 1200,
  },
});
