/// <reference types="vitest/config" />
import { fileURLToPath } from "node:url";
import react from "@vitejs/plugin-react";
import tailwindcss from "@tailwindcss/vite";
import { defineConfig } from "vite";

const srcDir = fileURLToPath(new URL("./src", import.meta.url));

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: { alias: { "@": srcDir } },
  server: {
    host: "127.0.0.1",
    proxy: { "/api": `http://127.0.0.1:${process.env.PORT ?? 3000}` },
  },
  build: { outDir: "dist", sourcemap: true },
  test: {
    // Each project is one kind of test; the database-backed ones start their own throwaway MariaDB.
    projects: [
      {
        extends: true,
        test: { name: "domain", include: ["tests/domain/**/*.test.ts"], environment: "node" },
      },
      {
        extends: true,
        test: {
          name: "client",
          include: ["tests/client/**/*.test.tsx"],
          environment: "happy-dom",
          setupFiles: ["tests/setup/client-setup.ts"],
          testTimeout: 20_000,
        },
      },
      {
        extends: true,
        test: {
          name: "server",
          include: ["tests/server/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/setup/global-mariadb.ts"],
          setupFiles: ["tests/setup/server-setup.ts"],
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/setup/global-mariadb.ts"],
          setupFiles: ["tests/setup/server-setup.ts"],
          // A browser on a busy 2-core machine: expect.poll waits for a state up to 20 s (vitest's
          // default is 1 s), and a whole journey may take minutes.
          expect: { poll: { timeout: 20_000, interval: 100 } },
          testTimeout: 180_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
