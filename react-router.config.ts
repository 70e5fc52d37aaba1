import type { Config } from "@react-router/dev/config";

export default {
  ssr: true,
  // Browser tests build into a folder of their own so a parallel run never serves another's build.
  buildDirectory: process.env.BUILD_DIR ?? "build",
} satisfies Config;
