/// <reference types="vitest/config" />
import { fileURLToPath } from "node:url";
import react from "@vitejs/plugin-react";
import tailwindcss from "@tailwindcss/vite";
import { defineConfig } from "vite";
import { VitePWA } from "vite-plugin-pwa";

const srcDir = fileURLToPath(new URL("./src", import.meta.url));

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // Installable, and the app's own files kept by a service worker so it opens without signal.
    // Only the built shell is precached: nothing under /api/ is ever cached (answers are personal and
    // change), so an offline page shows what the report queue keeps on the phone, never an old answer.
    VitePWA({
      registerType: "autoUpdate",
      injectRegister: false,
      includeAssets: ["apple-touch-icon.png"],
      manifest: {
        name: "Dewline",
        short_name: "Dewline",
        description: "Report damp, condensation and mould in your home, and follow it until it is fixed.",
        lang: "en-GB",
        start_url: "/",
        scope: "/",
        display: "standalone",
        theme_color: "#16232e",
        background_color: "#ffffff",
        icons: [
          { src: "icon-192.png", sizes: "192x192", type: "image/png" },
          { src: "icon-512.png", sizes: "512x512", type: "image/png" },
          { src: "icon-maskable-512.png", sizes: "512x512", type: "image/png", purpose: "maskable" },
        ],
      },
      workbox: {
        globPatterns: ["**/*.{js,css,html,svg,png,woff2}"],
        // Every page address opens the app shell; the client routes from there.
        navigateFallback: "/index.html",
        navigateFallbackDenylist: [/^\/api\//],
        // Some route chunks (charts, tables) pass workbox's 2 MiB default.
        maximumFileSizeToCacheInBytes: 5 * 1024 * 1024,
        cleanupOutdatedCaches: true,
        // The first visit is looked after too, not only the next one.
        clientsClaim: true,
      },
    }),
  ],
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
