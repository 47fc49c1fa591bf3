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
// by itself on the next visit. Only in a built app: the dev server has no worker. Registered a few
// seconds after the page's load event, when the browser is idle: at the load event itself (registerSW's
// default) its first install copied every file of the app while the first page was still drawing, and
// the queue's first rows came later (bench:queue; with workers blocked they came ~200 ms sooner).
const REGISTER_AFTER_LOAD_MS = 3000;
if (import.meta.env.PROD) {
  const register = () => void registerSW({ immediate: true });
  const later = () =>
    setTimeout(
      () => ("requestIdleCallback" in window ? requestIdleCallback(register, { timeout: 2000 }) : register()),
      REGISTER_AFTER_LOAD_MS,
    );
  if (document.readyState === "complete") later();
  else window.addEventListener("load", later, { once: true });
}
