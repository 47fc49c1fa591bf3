import { NotFound } from "@/components/errors/not-found";

export default function NotFoundPage() {
  return <NotFound />;
}
