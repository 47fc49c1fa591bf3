import type { TFunction } from "i18next";

/**
 * A form field's message in the reader's language: the forms' own checks give keys of the `auth`
 * text ("auth:form.emailRequired"); a message the server sent is shown as it came.
 */
export const formMessage = (t: TFunction, message: string | undefined): string | undefined =>
  message?.startsWith("auth:") ? t(message) : message;
