import type { Config } from "@react-router/dev/config";

export default {
  ssr: true,
  future: {
    // Middleware gives loaders a typed router context (the database handle, the session).
    v8_middleware: true,
  },
} satisfies Config;
