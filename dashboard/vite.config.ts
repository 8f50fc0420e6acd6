import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';
import { routePreload } from './build/route-preload';
import { paths } from './src/lib/paths';

const root = fileURLToPath(new URL('.', import.meta.url));

// In development the API runs on :3000 and Vite proxies /api to it; in production the API serves dist/.
export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // The pages that draw charts start downloading their code with the entry on a first load.
    routePreload(
      [
        { pattern: paths.trace.path, module: 'src/app/routes/trace.tsx' },
        { pattern: paths.circuit.path, module: 'src/app/routes/circuit.tsx' },
      ],
      root,
    ),
  ],
  server: {
    port: 5173,
    proxy: { '/api': 'http://127.0.0.1:3000', '/healthz': 'http://127.0.0.1:3000' },
  },
  build: { outDir: 'dist', sourcemap: false, chunkSizeWarningLimit: 900 },
});
