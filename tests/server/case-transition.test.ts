// CaseService.transition: the one way a case's status changes. One typed event and the stale triage
// mark are written with the status in the caller's transaction; a refused move changes nothing.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { CaseEvent } from "../../server/modules/cases/case-event.entity.js";
import { Case } from "../../server/modules/cases/case.entity.js";
import { ConflictError } from "../../server/lib/errors.js";
import { makeLandlord, PASSWORD } from "../support/factories.js";
import { createTestApp, signedInClient, type Client, type TestApp } from "../support/test-app.js";

let t: TestApp;
let landlord: Awaited<ReturnType<typeof makeLandlord>>;
let tenant: Client;
const report = {
  description: "Black mould behind the bedroom wardrobe.",
  locations: ["behind-furniture"],
  observations: ["mould-spots"],
};

beforeAll(async () => {
  t = await createTestApp();
  landlord = await makeLandlord(t.ctx.dataSource);
  tenant = await signedInClient(t.app, landlord.tenant.email, PASSWORD);
});
afterAll(() => t.close());

/** A new case whose triage figures are up to date (not stale), so a stale mark can only come from the move. */
async function freshCase(): Promise<number> {
  const { id } = (await tenant.post("/api/cases", report).expect(201)).body as { id: number };
  await t.ctx.dataSource.getRepository(Case).update(id, { triageDueAt: null });
  return id;
}

const stateOf = async (id: number) => {
  const c = await t.ctx.dataSource.getRepository(Case).findOneByOrFail({ id });
  const events = await t.ctx.dataSource.getRepository(CaseEvent).find({ where: { caseId: id }, order: { id: "ASC" } });
  return { status: c.status, stale: c.triageDueAt !== null, events };
};

describe("CaseService.transition", () => {
  it("writes the status, exactly one status-changed event and the stale mark, all in the caller's transaction", async () => {
    const id = await freshCase();
    const before = await stateOf(id);
    expect(before).toMatchObject({ status: "new", stale: false });

    // Rolled back with the caller's transaction: none of the three is left behind.
    await expect(
      t.ctx.dataSource.transaction(async (m) => {
        await t.ctx.services.cases.transition(m, id, "triaged", "Looked at the photos.", { id: landlord.officer.id });
        throw new Error("the caller's work failed");
      }),
    ).rejects.toThrow("the caller's work failed");
    expect(await stateOf(id)).toEqual(before);

    // Committed: all three.
    const result = await t.ctx.dataSource.transaction((m) =>
      t.ctx.services.cases.transition(m, id, "triaged", "Looked at the photos.", { id: landlord.officer.id }),
    );
    expect(result).toEqual({ from: "new", status: "triaged", moved: true });
    const after = await stateOf(id);
    expect(after.status).toBe("triaged");
    expect(after.stale).toBe(true);
    const added = after.events.slice(before.events.length);
    expect(added).toHaveLength(1);
    expect(added[0]).toMatchObject({
      type: "status-changed",
      actorUserId: landlord.officer.id,
      before: { status: "new" },
      after: { status: "triaged", reason: "Looked at the photos." },
    });
  });

  it("refuses a move the workflow does not allow (409) and changes nothing, even when the caller commits", async () => {
    const id = await freshCase();
    const before = await stateOf(id);
    const error = await t.ctx.dataSource.transaction(async (m) =>
      t.ctx.services.cases.transition(m, id, "closed", "Straight to closed.", { id: landlord.officer.id }).then(
        () => null,
        (e: unknown) => e,
      ),
    );
    expect(error).toBeInstanceOf(ConflictError);
    expect((error as ConflictError).message).toContain("cannot move to closed");
    expect(await stateOf(id)).toEqual(before);
  });

  it("skips a refused move when asked to follow the work only where the workflow allows", async () => {
    const id = await freshCase();
    const before = await stateOf(id);
    const result = await t.ctx.dataSource.transaction((m) =>
      t.ctx.services.cases.transition(m, id, "monitoring", "Works recorded.", null, { ifAllowed: true }),
    );
    expect(result).toEqual({ from: "new", status: "new", moved: false });
    expect(await stateOf(id)).toEqual(before);
  });

  it("needs a reason to cancel, and then changes nothing", async () => {
    const id = await freshCase();
    const before = await stateOf(id);
    await expect(
      t.ctx.dataSource.transaction((m) => t.ctx.services.cases.transition(m, id, "cancelled", null, { id: landlord.officer.id })),
    ).rejects.toThrow("reason");
    expect(await stateOf(id)).toEqual(before);
  });
});
