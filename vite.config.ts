import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

export default defineConfig({
  plugins: [react(), tailwindcss()],
  // The embedded database writes under .data/: keep it out of the watcher.
  server: { watch: { ignored: ['**/.data/**', '**/test-artifacts/**'] } },
  build: { outDir: 'dist', sourcemap: true },
});
