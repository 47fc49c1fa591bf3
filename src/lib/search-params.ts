import { useCallback, useEffect, useRef } from "react";
import { useNavigation, useSearchParams } from "react-router-dom";

export type SearchPatch = Record<string, string | number | null | undefined>;

/** A positive whole number from the URL, or the fallback when it is missing or nonsense. */
export function readPositiveInt(params: URLSearchParams, key: string, fallback: number, max = Number.MAX_SAFE_INTEGER): number {
  const raw = params.get(key);
  if (raw === null || !/^\d+$/.test(raw)) return fallback;
  const n = Number(raw);
  return n >= 1 ? Math.min(n, max) : fallback;
}

export function readString(params: URLSearchParams, key: string): string {
  return params.get(key)?.trim() ?? "";
}

const noDefaults: SearchPatch = {};

/**
 * Returns a function that merges a patch into the current search params. Empty values and values
 * equal to their default are removed, so shared links stay short. Callers choose whether a change
 * pushes a history entry (page moves, so Back steps through pages) or replaces it (typing).
 * Pass `defaults` as a module-level constant.
 */
export function usePatchSearchParams(defaults: SearchPatch = noDefaults) {
  const [searchParams, setSearchParams] = useSearchParams();
  const navigation = useNavigation();
  // A navigation waits for the route's loader before the URL changes, so a patch made in the meantime
  // would start from the old URL and drop the one before it. Patches build on the last one asked for
  // until no navigation is in flight (the URL has then caught up, or the navigation went elsewhere).
  const pending = useRef<URLSearchParams | null>(null);
  useEffect(() => {
    if (navigation.state === "idle") pending.current = null;
  }, [navigation.state, searchParams]);
  return useCallback(
    (patch: SearchPatch, options: { replace?: boolean } = {}) => {
      setSearchParams(
        (prev) => {
          const next = new URLSearchParams(pending.current ?? prev);
          for (const [key, value] of Object.entries(patch)) {
            if (value === undefined || value === null || value === "" || String(value) === String(defaults[key] ?? ""))
              next.delete(key);
            else next.set(key, String(value));
          }
          pending.current = next;
          return next;
        },
        { replace: options.replace ?? false },
      );
    },
    [setSearchParams, defaults],
  );
}
