import { zodResolver } from "@hookform/resolvers/zod";
import { useId, useState } from "react";
import { useForm } from "react-hook-form";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";
import { ApiError, errorMessage } from "@/lib/api-client";
import { API_SCOPES, apiScopeLabels, type ApiKeyCreatedResponse } from "@/lib/contracts";
import { apiKeyCreateSchema, useCreateApiKey, type ApiKeyCreateInput } from "../api/create-api-key";

/** The new key's secret, shown once: it is not stored, so it cannot be shown again. */
function NewSecret({ created, onDone }: { created: ApiKeyCreatedResponse; onDone: () => void }) {
  const [copied, setCopied] = useState(false);
  const secretId = useId();
  return (
    <Alert tone="success" title={`Key "${created.name}" created`} live="status">
      <p>Copy this key into the other system now. Dewline keeps only a fingerprint of it, so it cannot be shown again.</p>
      <label htmlFor={secretId} className="mt-3 block text-sm font-semibold">
        The key
      </label>
      <input
        id={secretId}
        readOnly
        value={created.secret}
        spellCheck={false}
        onFocus={(event) => event.currentTarget.select()}
        className="mt-1 w-full rounded border border-line bg-surface px-2 py-1 font-mono text-sm"
      />
      <div className="mt-3 flex flex-wrap gap-2">
        <Button
          size="sm"
          variant="secondary"
          onClick={() => {
            void navigator.clipboard?.writeText(created.secret).then(() => setCopied(true));
          }}
        >
          {copied ? "Copied" : "Copy the key"}
        </Button>
        <Button size="sm" onClick={onDone}>
          I have stored it
        </Button>
      </div>
    </Alert>
  );
}

export function CreateApiKeyForm() {
  const create = useCreateApiKey();
  const [created, setCreated] = useState<ApiKeyCreatedResponse | null>(null);
  const scopesId = useId();
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors },
  } = useForm<ApiKeyCreateInput>({
    resolver: zodResolver(apiKeyCreateSchema),
    defaultValues: { name: "", scopes: [] },
  });

  const onSubmit = handleSubmit((values) => {
    setCreated(null);
    create.mutate(values, {
      onSuccess: (result) => {
        setCreated(result);
        reset({ name: "", scopes: [] });
      },
      onError: (error) => {
        if (error instanceof ApiError && error.status === 400) {
          for (const { field, message } of error.fieldErrors) {
            if (field === "name" || field.startsWith("scopes")) setError(field === "name" ? "name" : "scopes", { message });
          }
        }
      },
    });
  });

  if (created) return <NewSecret created={created} onDone={() => setCreated(null)} />;

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      {create.isError ? (
        <Alert tone="danger" title="The key was not created">
          {errorMessage(create.error)}
        </Alert>
      ) : null}
      <Input
        label="Name"
        hint="The system that will use it, such as the housing management system."
        autoComplete="off"
        error={errors.name?.message}
        {...register("name")}
        className="max-w-md"
      />
      <fieldset aria-describedby={errors.scopes ? `${scopesId}-error` : undefined}>
        <legend className="font-semibold">What the key may do</legend>
        <div className="mt-2 flex flex-col gap-2">
          {API_SCOPES.map((scope) => (
            <label key={scope} className="flex items-center gap-2">
              <input type="checkbox" value={scope} {...register("scopes")} />
              <span>
                {apiScopeLabels[scope]} <code className="text-sm text-ink-soft">{scope}</code>
              </span>
            </label>
          ))}
        </div>
        {errors.scopes ? (
          <p id={`${scopesId}-error`} role="alert" className="mt-1 text-sm text-rust-700">
            {errors.scopes.message}
          </p>
        ) : null}
      </fieldset>
      <div>
        <Button type="submit" busy={create.isPending}>
          Create key
        </Button>
      </div>
    </form>
  );
}
