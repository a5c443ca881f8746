import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

export default defineConfig({
  plugins: [react(), tailwindcss()],
  server: {
    port: 5173,
    proxy: { '/api': `http://localhost:${process.env.PORT ?? 3000}` },
  },
  // The manifest maps each page's chunk to the files it needs: `npm run bench:server` sizes them.
  build: { outDir: 'dist', sourcemap: true, manifest: true },
});
