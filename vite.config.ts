import { fileURLToPath } from "node:url";
import tailwindcss from "@tailwindcss/vite";
import react from "@vitejs/plugin-react";
import { defineConfig } from "vite";

const apiPort = process.env.TAPWRIGHT_API_PORT ?? "3001";

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: {
    alias: {
      "@": fileURLToPath(new URL("./src", import.meta.url)),
      "@shared": fileURLToPath(new URL("./shared", import.meta.url)),
    },
  },
  worker: { format: "es" },
  build: { outDir: "dist/client", chunkSizeWarningLimit: 4000, sourcemap: false },
  server: { proxy: { "/api": `http://127.0.0.1:${apiPort}` } },
});
