import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Input } from "@/components/ui/field";
import { LoadingState } from "@/components/ui/spinner";
import { ApiError, errorMessage } from "@/lib/api-client";
import { contractorFormSchema, useCreateContractor, type ContractorFormInput } from "../api/create-contractor";
import { useContractors } from "@/lib/contractors";

const FIELDS = ["name", "email", "phone", "trade"] as const;
const blank: ContractorFormInput = { name: "", email: "", phone: "", trade: "" };

function ContractorList() {
  const contractors = useContractors();
  if (contractors.isPending) return <LoadingState>Loading contractors…</LoadingState>;
  if (contractors.isError)
    return (
      <Alert tone="danger" title="We could not load the contractors">
        <p>{errorMessage(contractors.error)}</p>
        <Button size="sm" variant="secondary" className="mt-2" onClick={() => void contractors.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  if (contractors.data.length === 0)
    return (
      <EmptyState title="No contractors yet" className="py-5">
        Add the firms you send work to; they can then be booked like an operative.
      </EmptyState>
    );
  return (
    <div className="overflow-x-auto rounded-md border border-line">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">Contractors</caption>
        <thead className="bg-dew-50">
          <tr>
            {["Name", "Trade", "E-mail", "Phone"].map((h) => (
              <th key={h} scope="col" className="border-b border-line-strong px-3 py-2 font-bold">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {contractors.data.map((c) => (
            <tr key={c.id} className="border-t border-line">
              <th scope="row" className="px-3 py-2 font-semibold">
                {c.name}
              </th>
              <td className="px-3 py-2">{c.trade || <span className="text-ink-soft">Not given</span>}</td>
              <td className="px-3 py-2">
                <a href={`mailto:${c.email}`} className="font-semibold text-dew-700 underline">
                  {c.email}
                </a>
              </td>
              <td className="px-3 py-2">
                {c.phone ? (
                  <a href={`tel:${c.phone.replace(/\s+/g, "")}`} className="text-dew-700 underline">
                    {c.phone}
                  </a>
                ) : (
                  <span className="text-ink-soft">Not given</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function AddContractorForm() {
  const create = useCreateContractor();
  const [added, setAdded] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors },
  } = useForm<ContractorFormInput>({ resolver: zodResolver(contractorFormSchema), defaultValues: blank });

  const onSubmit = handleSubmit((values) => {
    setAdded(null);
    create.mutate(values, {
      onSuccess: () => {
        setAdded(values.name);
        reset(blank);
      },
      onError: (error) => {
        if (error instanceof ApiError && error.status === 400) {
          for (const { field, message } of error.fieldErrors) {
            const f = FIELDS.find((k) => k === field);
            if (f) setError(f, { message });
          }
        }
      },
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-labelledby="add-contractor-heading" className="@container flex flex-col gap-3">
      <h3 id="add-contractor-heading" className="text-lg font-bold">
        Add a contractor
      </h3>
      {added ? <Alert tone="success">{added} was added. They can now be booked for work.</Alert> : null}
      {create.isError ? (
        <Alert tone="danger" title="The contractor was not added">
          {errorMessage(create.error)}
        </Alert>
      ) : null}
      <div className="grid grid-cols-1 gap-3 @lg:grid-cols-2">
        <Input label="Name" autoComplete="organization" error={errors.name?.message} {...register("name")} />
        <Input
          label="E-mail address"
          type="email"
          autoComplete="off"
          spellCheck={false}
          hint="Bookings are sent here."
          error={errors.email?.message}
          {...register("email")}
        />
        <Input label="Phone" type="tel" optional autoComplete="off" error={errors.phone?.message} {...register("phone")} />
        <Input
          label="Trade"
          optional
          hint="For example ventilation, roofing or plastering."
          error={errors.trade?.message}
          {...register("trade")}
        />
      </div>
      <div>
        <Button type="submit" busy={create.isPending}>
          Add contractor
        </Button>
      </div>
    </form>
  );
}

/** The outside firms work can be sent to, and a form to add one. */
export function ContractorsPanel() {
  return (
    <div className="flex flex-col gap-5">
      <ContractorList />
      <AddContractorForm />
    </div>
  );
}
