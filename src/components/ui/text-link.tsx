import { Link, type LinkProps } from "react-router-dom";
import { cn } from "@/lib/cn";

export const textLinkClasses = "font-semibold text-dew-700 underline decoration-2 hover:text-dew-900 hover:decoration-4";

export function TextLink({ className, ...props }: LinkProps) {
  return <Link className={cn(textLinkClasses, className)} {...props} />;
}
