import { isRouteErrorResponse, useRouteError } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { buttonClasses } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { ApiError, errorMessage } from "@/lib/api-client";
import { useErrorWords } from "./error-words";
import { NotFound } from "./not-found";

/** A failed chunk download after a new release reads like this in the main browsers. */
const isStaleChunk = (e: unknown) =>
  e instanceof Error && /dynamically imported module|Importing a module script failed|error loading dynamically/i.test(e.message);

/**
 * The errorElement of every route: a readable message instead of a blank screen, a way to try
 * again and a way back to the start.
 */
export function RouteError() {
  const error = useRouteError();
  const w = useErrorWords();

  if (isRouteErrorResponse(error) && error.status === 404) return <NotFound />;

  let message = w.errorText;
  if (error instanceof ApiError) message = errorMessage(error);
  else if (isStaleChunk(error)) message = w.staleText;
  else if (isRouteErrorResponse(error))
    message = typeof error.data === "string" && error.data ? error.data : error.statusText || message;

  if (import.meta.env.DEV && error instanceof Error) console.error(error);

  return (
    <div className="flex flex-col gap-4">
      <title>{`${w.errorTitle}${w.titleSuffix}`}</title>
      <PageHeader title={w.errorTitle} />
      <Alert tone="danger" live="alert">
        {message}
      </Alert>
      <div className="flex flex-wrap items-center gap-4">
        <button type="button" className={buttonClasses("primary")} onClick={() => window.location.reload()}>
          {w.reload}
        </button>
        <TextLink to="/">{w.startPage}</TextLink>
      </div>
    </div>
  );
}

/** The root-level boundary has no layout around it, so it brings a minimal one. */
export function RootRouteError() {
  return (
    <main id="main" className="mx-auto w-full max-w-reading px-4 py-10">
      <RouteError />
    </main>
  );
}
