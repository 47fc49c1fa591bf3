import { useId, useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Select, Textarea } from "@/components/ui/field";
import { londonDateOf } from "@/lib/dates";
import { FanGuidance } from "./fan-guidance";
import { errorMessage } from "@/lib/api-client";
import { useCreateWorkOrder } from "../api/create-work-order";
import { WORK_ORDER_TYPES, type WorkOrderPriority, type WorkOrderType } from "../api/case-types";
import { isFanWork } from "@/lib/extract-rates";
import { PRIORITY_CHOICES, WORK_TYPE_WORDS, longDate, workTypeLabel } from "../lib/words";
import { blankNewOrder, checkNewOrder, type NewOrderErrors, type NewOrderFields } from "../lib/work-order-forms";
import { RadioGroup } from "@/components/ui/option-radio-group";

interface NewWorkOrderFormProps {
  caseId: number;
  /** The home's rooms, to tick where the work is. */
  rooms: readonly { id: number; name: string }[];
  /** When the safety work is due (the default target date), if the deadlines are known. */
  safetyWorkDueAt?: string | null;
}

/** A new piece of work for the case: what, where, how soon and by when. */
export function NewWorkOrderForm({ caseId, rooms, safetyWorkDueAt }: NewWorkOrderFormProps) {
  const create = useCreateWorkOrder(caseId);
  const roomsId = useId();
  const [fields, setFields] = useState<NewOrderFields>(blankNewOrder);
  const [errors, setErrors] = useState<NewOrderErrors>({});
  const [saved, setSaved] = useState<string | null>(null);
  const typeRef = useRef<HTMLSelectElement>(null);
  const descriptionRef = useRef<HTMLTextAreaElement>(null);
  const dateRef = useRef<HTMLInputElement>(null);

  const set = <K extends keyof NewOrderFields>(key: K, value: NewOrderFields[K]) => {
    setSaved(null);
    create.reset();
    setFields((f) => ({ ...f, [key]: value }));
    if (key in errors) setErrors((e) => ({ ...e, [key]: undefined }));
  };

  const toggleRoom = (id: number, on: boolean) =>
    set("roomIds", on ? [...fields.roomIds, id] : fields.roomIds.filter((r) => r !== id));

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setSaved(null);
    const { input, errors: found } = checkNewOrder(fields);
    setErrors(found);
    if (found.type) return typeRef.current?.focus();
    if (found.description) return descriptionRef.current?.focus();
    if (found.targetDate) return dateRef.current?.focus();
    if (!input) return;
    create.mutate(input, {
      onSuccess: (order) => {
        setSaved(
          `Work order added: ${workTypeLabel(order.type)}${order.targetDate ? `, to be done by ${longDate(order.targetDate)}` : ""}.`,
        );
        setFields(blankNewOrder());
      },
    });
  };

  const dueDay = safetyWorkDueAt ? longDate(londonDateOf(new Date(safetyWorkDueAt))) : null;

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <Select
        ref={typeRef}
        label="Type of work"
        value={fields.type}
        error={errors.type}
        onChange={(e) => set("type", e.target.value as WorkOrderType | "")}
        controlClassName="sm:max-w-md"
      >
        <option value="">Choose the type of work</option>
        {WORK_ORDER_TYPES.map((t) => (
          <option key={t} value={t}>
            {WORK_TYPE_WORDS[t].label}
          </option>
        ))}
      </Select>
      {fields.type && isFanWork(fields.type) ? <FanGuidance headingLevel={4} /> : null}
      <Textarea
        ref={descriptionRef}
        label="Description"
        hint="What needs doing, for the operative. The tenant sees the type of work and the rooms."
        rows={3}
        maxLength={4000}
        value={fields.description}
        error={errors.description}
        onChange={(e) => set("description", e.target.value)}
      />
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 font-bold">
          Rooms <span className="font-normal text-ink-soft">(optional)</span>
        </legend>
        {rooms.length === 0 ? (
          <p className="text-ink-soft">This home has no rooms on record.</p>
        ) : (
          <div id={roomsId} className="grid grid-cols-1 gap-2 sm:grid-cols-3">
            {rooms.map((r) => (
              <label key={r.id} className="flex cursor-pointer items-center gap-2">
                <input
                  type="checkbox"
                  className="size-5 accent-dew-700"
                  checked={fields.roomIds.includes(r.id)}
                  onChange={(e) => toggleRoom(r.id, e.target.checked)}
                />
                {r.name}
              </label>
            ))}
          </div>
        )}
      </fieldset>
      <RadioGroup<WorkOrderPriority>
        legend="Priority"
        options={PRIORITY_CHOICES}
        value={fields.priority}
        onChange={(v) => set("priority", v)}
        error={errors.priority}
        columns={3}
      />
      <Input
        ref={dateRef}
        type="date"
        label="Target date"
        optional
        hint={
          dueDay
            ? `Leave empty to use the safety-work deadline (${dueDay}).`
            : "Leave empty to use the safety-work deadline of the case, once it is known."
        }
        value={fields.targetDate}
        error={errors.targetDate}
        onChange={(e) => set("targetDate", e.target.value)}
        controlClassName="sm:max-w-xs"
      />
      {Object.values(errors).some(Boolean) ? (
        <Alert tone="danger" title="The work order was not added">
          Please correct the fields marked above.
        </Alert>
      ) : null}
      {create.isError ? (
        <Alert tone="danger" title="The work order was not added">
          {errorMessage(create.error)}
        </Alert>
      ) : null}
      {saved ? (
        <Alert tone="success" title={saved}>
          It is in the list below, ready to be scheduled.
        </Alert>
      ) : null}
      <div>
        <Button type="submit" busy={create.isPending}>
          Add work order
        </Button>
      </div>
    </form>
  );
}
