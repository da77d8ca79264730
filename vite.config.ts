import { reactRouter } from "@react-router/dev/vite";
import tailwindcss from "@tailwindcss/vite";
import { defineConfig, type Plugin } from "vite";
import { fileURLToPath } from "node:url";

/**
 * The production build also bundles the command-line checker the help pages offer and the entry
 * of the checker threads, beside the server bundle (scripts/build-cli.mjs).
 */
function checkerCliBundle(): Plugin {
  return {
    name: "runproof-checker-cli",
    apply: "build",
    async closeBundle() {
      if (!this.environment || this.environment.name !== "ssr") return;
      const { buildCli, buildCheckerThread } = await import("./scripts/build-cli.mjs");
      await Promise.all([buildCli(), buildCheckerThread()]);
    },
  };
}

export default defineConfig(({ isSsrBuild }) => ({
  // The server bundle is our own HTTP app (server/index.ts), which wraps React Router's build.
  build: isSsrBuild ? { rollupOptions: { input: "./server/index.ts" } } : undefined,
  plugins: [tailwindcss(), reactRouter(), checkerCliBundle()],
  resolve: {
    alias: {
      "~": fileURLToPath(new URL("./app", import.meta.url)),
      "~db": fileURLToPath(new URL("./database", import.meta.url)),
    },
  },
  server: { host: "127.0.0.1", port: 5173 },
}));
