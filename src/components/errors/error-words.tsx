import { createContext, useContext } from "react";

/**
 * The error pages' words. Staff see these English ones; the tenant's shell and the public pages
 * provide them translated (these shared components must not load the language machinery, which the
 * officers' queue's first load leaves out).
 */
export interface ErrorWords {
  notFoundTitle: string;
  notFoundText: string;
  startPage: string;
  notAllowedTitle: string;
  notAllowedText: string;
  notAllowedAsk: string;
  notAllowedOtherKind: string;
  goTo: (place: string) => string;
  errorTitle: string;
  errorText: string;
  staleText: string;
  reload: string;
  /** Appended to every page title: " · Dewline". */
  titleSuffix: string;
}

export const ENGLISH_ERROR_WORDS: ErrorWords = {
  notFoundTitle: "Page not found",
  notFoundText: "There is no page at this address. The link may be mistyped, or the page may have moved.",
  startPage: "Go to the start page",
  notAllowedTitle: "Not allowed",
  notAllowedText: "Your account cannot open this page: it is for people with a different role in Dewline.",
  notAllowedAsk: "If you think you should be able to see it, ask your organisation's Dewline administrator.",
  notAllowedOtherKind: "It is for another kind of account, such as a tenant's. Every staff page is in the menu.",
  goTo: (place) => `Go to ${place}`,
  errorTitle: "Something went wrong",
  errorText: "Something went wrong while showing this page. Please try again.",
  staleText: "Dewline has been updated since you opened it. Reload the page to get the new version.",
  reload: "Reload the page",
  titleSuffix: " · Dewline",
};

export const ErrorWordsContext = createContext<ErrorWords>(ENGLISH_ERROR_WORDS);

export const useErrorWords = () => useContext(ErrorWordsContext);
