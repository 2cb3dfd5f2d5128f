import { fileURLToPath, URL } from 'node:url';
import { defineConfig } from 'vite';
import tailwindcss from '@tailwindcss/vite';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

// The client is built into dist/ and served by the Express app on one port.
export default defineConfig({
  plugins: [tailwindcss()],
  resolve: {
    alias: {
      '@shared': here('./shared'),
      '@': here('./src'),
      // pose-detection's bundle imports this non-ES-module script for a runtime we never use.
      '@mediapipe/pose': here('./shared/pose/mediapipe-pose-shim.ts'),
    },
  },
  // Model weights and wasm binaries are served from the app's own origin (never a CDN).
  publicDir: false,
  build: {
    outDir: 'dist',
    sourcemap: true,
    chunkSizeWarningLimit: 4000,
  },
  worker: { format: 'es' },
  server: {
    port: 5173,
    proxy: {
      '/api': 'http://127.0.0.1:4810',
      '/models': 'http://127.0.0.1:4810',
      '/wasm': 'http://127.0.0.1:4810',
    },
  },
});
