import { StrictMode } from "react";
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
