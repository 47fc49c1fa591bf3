import { StrictMode } from "react";
// A module vite-plugin-pwa makes at build time (typed by vite-plugin-pwa/client): no file for eslint to find.
// eslint-disable-next-line import-x/no-unresolved -- virtual module, checked by tsc instead
import { registerSW } from "virtual:pwa-register";
import { createRoot } from "react-dom/client";
import { AppProvider, createAppQueryClient } from "@/app/provider";
import { AppRouter, createAppRouter } from "@/app/router";
import "@/styles/index.css";

const container = document.getElementById("root");
if (!container) throw new Error("index.html has no #root element.");

const queryClient = createAppQueryClient();
const router = createAppRouter(queryClient);

createRoot(container).render(
  <StrictMode>
    <AppProvider queryClient={queryClient}>
      <AppRouter router={router} />
    </AppProvider>
  </StrictMode>,
);

// The service worker keeps the app's own files so it opens with no signal; a new version takes over
// by itself on the next visit. Only in a built app: the dev server has no worker. Registered once the
// page has loaded (registerSW's default), so copying the app's files does not compete with the first page.
if (import.meta.env.PROD) registerSW();
