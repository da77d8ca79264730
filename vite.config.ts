import { reactRouter } from "@react-router/dev/vite";
import tailwindcss from "@tailwindcss/vite";
import { defineConfig } from "vite";
import { fileURLToPath } from "node:url";

export default defineConfig(({ isSsrBuild }) => ({
  // The server bundle is our own HTTP app (server/index.ts), which wraps React Router's build.
  build: isSsrBuild ? { rollupOptions: { input: "./server/index.ts" } } : undefined,
  plugins: [tailwindcss(), reactRouter()],
  resolve: {
    alias: {
      "~": fileURLToPath(new URL("./app", import.meta.url)),
      "~db": fileURLToPath(new URL("./database", import.meta.url)),
    },
  },
  server: { host: "127.0.0.1", port: 5173 },
}));
