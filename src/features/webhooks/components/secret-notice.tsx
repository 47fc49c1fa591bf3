import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";

/** The signing secret, shown once: the admin copies it into the receiving system now. */
export function SecretNotice({ secret, onDone }: { secret: string; onDone: () => void }) {
  return (
    <Alert tone="warning" title="Copy the signing secret now" live="status">
      <p>
        The receiving system checks every event with this secret. Dewline will not show it again; if it is lost, make a new one.
      </p>
      <p className="my-2 font-mono text-sm break-all" aria-label="Signing secret">
        {secret}
      </p>
      <span className="flex flex-wrap gap-2">
        <Button size="sm" variant="secondary" onClick={() => void navigator.clipboard?.writeText(secret)}>
          Copy
        </Button>
        <Button size="sm" variant="ghost" onClick={onDone}>
          I have stored it
        </Button>
      </span>
    </Alert>
  );
}
