import { render } from "@testing-library/react";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import { AppProvider, createAppQueryClient } from "@/app/provider";
import { createAppRoutes } from "@/app/router";

/** The real app (routes, guards, layouts, pages) at a URL, with a fresh query cache. */
export function renderApp(url: string) {
  const queryClient = createAppQueryClient();
  const router = createMemoryRouter(createAppRoutes(queryClient), { initialEntries: [url] });
  const result = render(
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { ...result, router, queryClient };
}
