import { useEffect, useRef } from "react";
import { useLocation } from "react-router-dom";

/**
 * After a client-side move to another page, put focus on the new page's heading so keyboard and
 * screen reader users start at the top of the new content. Changes of search params (table
 * filters, pages) keep focus where it is.
 */
export function FocusOnNavigate() {
  const { pathname } = useLocation();
  const previous = useRef(pathname);
  useEffect(() => {
    if (previous.current === pathname) return;
    previous.current = pathname;
    const heading = document.querySelector<HTMLElement>("main h1");
    heading?.focus({ preventScroll: false });
  }, [pathname]);
  return null;
}
