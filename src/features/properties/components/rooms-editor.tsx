import { useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { Input, Select } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { ROOM_KINDS, roomKindLabels, type Property, type Room, type RoomKind } from "@/lib/homes";
import { roomSchema } from "@/lib/schemas/homes";
import { useRoomChanges } from "../api/save-home";

function RoomFields({
  name,
  kind,
  onName,
  onKind,
  errors,
  idPrefix,
}: {
  name: string;
  kind: RoomKind | "";
  onName: (v: string) => void;
  onKind: (v: RoomKind | "") => void;
  errors: { name?: string; kind?: string };
  idPrefix: string;
}) {
  return (
    <>
      <Input
        id={`${idPrefix}-name`}
        label="Room name"
        value={name}
        onChange={(e) => onName(e.target.value)}
        error={errors.name}
      />
      <Select
        id={`${idPrefix}-kind`}
        label="Kind of room"
        value={kind}
        onChange={(e) => onKind(e.target.value as RoomKind | "")}
        error={errors.kind}
      >
        <option value="">Choose…</option>
        {ROOM_KINDS.map((k) => (
          <option key={k} value={k}>
            {roomKindLabels[k]}
          </option>
        ))}
      </Select>
    </>
  );
}

const check = (name: string, kind: string) => {
  const parsed = roomSchema.safeParse({ name, kind });
  if (parsed.success) return { ok: parsed.data, errors: {} };
  const errors: { name?: string; kind?: string } = {};
  for (const issue of parsed.error.issues) {
    if (issue.path[0] === "name") errors.name ??= issue.message;
    if (issue.path[0] === "kind") errors.kind ??= "Choose the kind of room.";
  }
  return { ok: null, errors };
};

function RoomRow({ room, homeId, onRemove }: { room: Room; homeId: number; onRemove: (room: Room) => void }) {
  const { rename } = useRoomChanges(homeId);
  const [editing, setEditing] = useState(false);
  const [name, setName] = useState(room.name);
  const [kind, setKind] = useState<RoomKind | "">(room.kind);
  const [errors, setErrors] = useState<{ name?: string; kind?: string }>({});

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const { ok, errors } = check(name, kind);
    setErrors(errors);
    if (!ok) return;
    rename.mutate({ roomId: room.id, changes: ok }, { onSuccess: () => setEditing(false) });
  };

  if (!editing)
    return (
      <li className="flex flex-wrap items-center justify-between gap-2 rounded-md border border-line px-3 py-2">
        <span>
          <span className="font-semibold">{room.name}</span>
          <span className="block text-sm text-ink-soft">{roomKindLabels[room.kind]}</span>
        </span>
        <span className="flex gap-2">
          <Button size="sm" variant="secondary" onClick={() => setEditing(true)}>
            Rename<span className="sr-only"> {room.name}</span>
          </Button>
          <Button size="sm" variant="ghost" onClick={() => onRemove(room)}>
            Remove<span className="sr-only"> {room.name}</span>
          </Button>
        </span>
      </li>
    );
  return (
    <li className="rounded-md border border-line px-3 py-2">
      <form onSubmit={submit} noValidate aria-label={`Rename ${room.name}`} className="flex flex-col gap-3">
        <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
          <RoomFields name={name} kind={kind} onName={setName} onKind={setKind} errors={errors} idPrefix={`room-${room.id}`} />
        </div>
        {rename.isError ? <Alert tone="danger">{errorMessage(rename.error)}</Alert> : null}
        <div className="flex gap-2">
          <Button type="submit" size="sm" busy={rename.isPending}>
            Save the room
          </Button>
          <Button size="sm" variant="secondary" onClick={() => setEditing(false)}>
            Cancel
          </Button>
        </div>
      </form>
    </li>
  );
}

/** Admin: the home's rooms, each renamed or removed (with a confirmation), and a room added. */
export function RoomsEditor({ home }: { home: Property }) {
  const { add, remove } = useRoomChanges(home.id);
  const [name, setName] = useState("");
  const [kind, setKind] = useState<RoomKind | "">("");
  const [errors, setErrors] = useState<{ name?: string; kind?: string }>({});
  const [removing, setRemoving] = useState<Room | null>(null);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const { ok, errors } = check(name, kind);
    setErrors(errors);
    if (!ok) return;
    add.mutate(ok, {
      onSuccess: () => {
        setName("");
        setKind("");
      },
    });
  };

  return (
    <div className="flex flex-col gap-4">
      {home.rooms.length ? (
        <ul className="flex flex-col gap-2">
          {home.rooms.map((r) => (
            <RoomRow key={r.id} room={r} homeId={home.id} onRemove={(room) => (remove.reset(), setRemoving(room))} />
          ))}
        </ul>
      ) : (
        <p className="text-ink-soft">No rooms yet. Add the rooms so reports and readings can name them.</p>
      )}
      <form onSubmit={submit} noValidate aria-label="Add a room" className="flex flex-col gap-3 rounded-md bg-paper p-3">
        <h3 className="font-bold">Add a room</h3>
        <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
          <RoomFields name={name} kind={kind} onName={setName} onKind={setKind} errors={errors} idPrefix="new-room" />
        </div>
        {add.isError ? <Alert tone="danger">{errorMessage(add.error)}</Alert> : null}
        <div>
          <Button type="submit" size="sm" busy={add.isPending}>
            Add the room
          </Button>
        </div>
      </form>
      <ConfirmDialog
        open={removing !== null}
        title={`Remove ${removing?.name ?? "the room"}?`}
        confirmLabel="Remove the room"
        cancelLabel="Keep it"
        tone="danger"
        busy={remove.isPending}
        error={remove.isError ? errorMessage(remove.error) : null}
        onConfirm={() => removing && remove.mutate(removing.id, { onSuccess: () => setRemoving(null) })}
        onCancel={() => setRemoving(null)}
      >
        Reports that named this room will no longer show it. A room with readings cannot be removed.
      </ConfirmDialog>
    </div>
  );
}
