// The officers' deadline digest: who gets which cases, once a day, on working days only.
//
// The denormalised next deadline on `cases` (next_stage, next_due_at) is normally worked out by the
// triage code; these tests set it directly on the rows (repository update, triage_due_at = null so
// nothing recomputes it) to put deadlines exactly where each check needs them.
//
// All dates are in December 2024, when London is on GMT (local time = UTC), and are earlier than any
// case other test files make (they start in 2025), so digests of theirs cannot join in.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { bankHolidayDates } from "../../src/lib/domain/working-days.js";
import type { DeadlineStage } from "../../src/lib/domain/deadlines.js";
import type { CaseStatus } from "../../src/lib/schemas/case-report.js";
import { Case } from "../../server/modules/cases/case.entity.js";
import { DeadlineDigest } from "../../server/modules/digest/deadline-digest.entity.js";
import { startDigestScheduler } from "../../server/modules/digest/digest.scheduler.js";
import { OutboxEmail } from "../../server/modules/mail/outbox-email.entity.js";
import type { Property } from "../../server/modules/properties/property.entity.js";
import type { User } from "../../server/modules/users/user.entity.js";
import { makeLandlord, makeUser } from "../support/factories.js";
import { mailSettled } from "../support/outbox.js";
import { createTestApp, type TestApp } from "../support/test-app.js";

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

type Landlord = Awaited<ReturnType<typeof makeLandlord>>;

/** A case at `home` whose next deadline is `stage` at `dueAt` (set directly, see the top of the file). */
async function makeCase(
  home: Property,
  o: { assignee?: User | null; stage?: DeadlineStage | null; dueAt: string | null; status?: CaseStatus },
  reporter: User,
) {
  const repo = t.ctx.dataSource.getRepository(Case);
  const saved = await repo.save(
    repo.create({
      organisationId: home.organisationId,
      propertyId: home.id,
      reporterUserId: reporter.id,
      channel: "phone",
      awareAt: new Date("2024-11-20T10:00:00Z"),
      description: "Mould on the bedroom wall behind the wardrobe.",
      locations: ["external-wall"],
      observations: ["mould-spots"],
      status: o.status ?? "triaged",
      assigneeUserId: o.assignee?.id ?? null,
    }),
  );
  const reference = `DG-${saved.id}`;
  await repo.update(saved.id, {
    reference,
    nextStage: o.dueAt === null ? null : (o.stage ?? "investigate"),
    nextDueAt: o.dueAt === null ? null : new Date(o.dueAt),
    triageDueAt: null,
  });
  return { id: saved.id, reference };
}

const mailsTo = (user: User) => t.mail.mails.filter((m) => m.to.includes(user.email));
const sendDue = async (at: string) => {
  const run = await t.ctx.services.digest.sendDue(new Date(at));
  // The relay sends the digests after they are recorded.
  await mailSettled(t);
  return run;
};

describe("the deadline digest", () => {
  let a: Landlord;
  let b: Landlord;
  let otherOfficer: User;
  let disabledOfficer: User;
  const c: Record<string, { id: number; reference: string }> = {};

  beforeAll(async () => {
    a = await makeLandlord(t.ctx.dataSource);
    b = await makeLandlord(t.ctx.dataSource);
    otherOfficer = await makeUser(t.ctx.dataSource, a.org, "officer", { name: "Other Officer" });
    disabledOfficer = await makeUser(t.ctx.dataSource, a.org, "officer", { status: "disabled" });
    const me = a.officer;
    // "Today" is Tuesday 3 December 2024; the window ends with Thursday 5 December (2 working days).
    c.overdue = await makeCase(a.home, { assignee: null, stage: "investigate", dueAt: "2024-12-02T23:59:59.999Z" }, me);
    c.laterToday = await makeCase(a.home, { assignee: me, stage: "make-safe", dueAt: "2024-12-03T14:30:00.000Z" }, me);
    c.tomorrow = await makeCase(a.home, { assignee: me, stage: "summary", dueAt: "2024-12-04T23:59:59.999Z" }, me);
    c.lastDay = await makeCase(a.home, { assignee: me, stage: "safety-work", dueAt: "2024-12-05T23:59:59.999Z" }, me);
    c.dayAfter = await makeCase(a.home, { assignee: me, stage: "summary", dueAt: "2024-12-06T10:00:00.000Z" }, me);
    c.nextWeek = await makeCase(a.home, { assignee: me, stage: "investigate", dueAt: "2024-12-10T23:59:59.999Z" }, me);
    c.noDeadline = await makeCase(a.home, { assignee: me, dueAt: null }, me);
    c.closed = await makeCase(a.home, { assignee: me, dueAt: "2024-12-01T23:59:59.999Z", status: "closed" }, me);
    c.cancelled = await makeCase(a.home, { assignee: null, dueAt: "2024-12-01T23:59:59.999Z", status: "cancelled" }, me);
    c.othersCase = await makeCase(
      a.home,
      { assignee: otherOfficer, stage: "investigate", dueAt: "2024-12-04T23:59:59.999Z" },
      me,
    );
    c.maintenanceCase = await makeCase(
      a.home,
      { assignee: a.maintenance, stage: "safety-work", dueAt: "2024-12-04T23:59:59.999Z" },
      me,
    );
    c.otherLandlord = await makeCase(
      b.home,
      { assignee: null, stage: "investigate", dueAt: "2024-12-04T23:59:59.999Z" },
      b.officer,
    );
  });

  it("e-mails each officer their own and the unassigned cases due within two working days, overdue first", async () => {
    const run = await sendDue("2024-12-03T07:00:00Z");
    expect(run).toMatchObject({ date: "2024-12-03", workingDay: true, failed: 0 });

    expect(mailsTo(a.officer)).toHaveLength(1);
    const mail = mailsTo(a.officer)[0]!;
    expect(mail.subject).toBe("Deadlines for Tuesday 3 December 2024: 4 cases, 1 overdue");
    const text = mail.raw;
    const order = [c.overdue, c.laterToday, c.tomorrow, c.lastDay].map((x) => text.indexOf(`${x.reference},`));
    expect(order.every((i) => i > 0)).toBe(true);
    expect([...order].sort((x, y) => x - y)).toEqual(order);
    for (const x of [
      c.dayAfter,
      c.nextWeek,
      c.noDeadline,
      c.closed,
      c.cancelled,
      c.othersCase,
      c.maintenanceCase,
      c.otherLandlord,
    ]) {
      expect(text).not.toContain(`${x.reference},`);
    }

    // Overdue is said in words; stages in plain words; due times in London time.
    expect(text).toContain(`OVERDUE: ${c.overdue.reference}, ${a.home.addressLine1}, Testford ZX1 1AA`);
    expect(text).toContain("Investigate the hazard: was due by the end of Monday 2 December 2024 (23:59), and is now overdue");
    expect(text).toContain("Make the home safe (emergency hazard): due Tuesday 3 December 2024 at 14:30");
    expect(text).toContain(
      "Send the tenant the written summary of the investigation: due by the end of Wednesday 4 December 2024 (23:59)",
    );
    expect(text).toContain("by the end of Thursday 5 December 2024");
    expect(text).toContain("Not assigned to anyone yet");
    expect(text).toContain("Assigned to you");
    for (const x of [c.overdue, c.laterToday, c.tomorrow, c.lastDay]) expect(text).toContain(`http://dewline.test/cases/${x.id}`);
    expect(text).toContain("http://dewline.test/queue?dueWithin=2");

    // The other officer: their own case and the unassigned one, not the first officer's.
    expect(mailsTo(otherOfficer)).toHaveLength(1);
    const other = mailsTo(otherOfficer)[0]!.raw;
    expect(other).toContain(`OVERDUE: ${c.overdue.reference},`);
    expect(other).toContain(`${c.othersCase.reference},`);
    expect(other).not.toContain(`${c.tomorrow.reference},`);
    // The other landlord's officer sees only their landlord's case; no e-mail for anyone who is not an active officer.
    expect(mailsTo(b.officer)).toHaveLength(1);
    expect(mailsTo(b.officer)[0]!.raw).toContain(`${c.otherLandlord.reference},`);
    expect(mailsTo(b.officer)[0]!.raw).not.toContain(`${c.overdue.reference},`);
    for (const u of [disabledOfficer, a.maintenance, a.admin, a.tenant]) expect(mailsTo(u)).toHaveLength(0);

    // The day is recorded with the outbox e-mail it sent.
    const digest = await t.ctx.dataSource
      .getRepository(DeadlineDigest)
      .findOneByOrFail({ userId: a.officer.id, digestDate: "2024-12-03" });
    const outbox = await t.ctx.dataSource.getRepository(OutboxEmail).findOneByOrFail({ id: digest.outboxEmailId });
    expect(outbox).toMatchObject({
      toAddress: a.officer.email,
      template: "deadlineDigest",
      status: "sent",
      organisationId: a.org.id,
    });
  });

  it("sends nothing more the same day, even when two runs race", async () => {
    await sendDue("2024-12-03T15:00:00Z");
    expect(mailsTo(a.officer)).toHaveLength(1);
    expect(mailsTo(otherOfficer)).toHaveLength(1);

    // The next day two runs at once still make one e-mail per officer (the unique day row decides).
    const runs = await Promise.all([sendDue("2024-12-04T07:00:00Z"), sendDue("2024-12-04T07:00:01Z")]);
    expect(runs.every((r) => r.failed === 0)).toBe(true);
    expect(mailsTo(a.officer)).toHaveLength(2);
    expect(mailsTo(otherOfficer)).toHaveLength(2);
    const outbox = await t.ctx.dataSource
      .getRepository(OutboxEmail)
      .findBy({ toAddress: a.officer.email, template: "deadlineDigest" });
    expect(outbox.map((o) => o.status)).toEqual(["sent", "sent"]);
    // Wednesday's window ends with Friday 6 December: that case joins, next week's still does not.
    const wednesday = mailsTo(a.officer)[1]!.raw;
    expect(wednesday).toContain(`${c.dayAfter.reference},`);
    expect(wednesday).not.toContain(`${c.nextWeek.reference},`);
  });

  it("sends nothing on a Saturday or Sunday, and sends again on Monday", async () => {
    const landlord = await makeLandlord(t.ctx.dataSource);
    await makeCase(landlord.home, { assignee: landlord.officer, dueAt: "2024-12-05T23:59:59.999Z" }, landlord.officer);
    expect(await sendDue("2024-12-07T09:00:00Z")).toMatchObject({ date: "2024-12-07", workingDay: false, sent: 0 });
    expect(await sendDue("2024-12-08T09:00:00Z")).toMatchObject({ date: "2024-12-08", workingDay: false, sent: 0 });
    expect(mailsTo(landlord.officer)).toHaveLength(0);
    await sendDue("2024-12-09T09:00:00Z");
    expect(mailsTo(landlord.officer)).toHaveLength(1);
  });

  it("counts working days across Christmas: bank holidays neither get a digest nor count in the window", async () => {
    // Christmas Day (Wed 25) and Boxing Day (Thu 26 December 2024) are bank holidays in England
    // and Wales: from the date-holidays package's data (GB-ENG), which matches the GOV.UK list (from memory).
    expect(bankHolidayDates(2024)).toEqual(expect.arrayContaining(["2024-12-25", "2024-12-26"]));
    const landlord = await makeLandlord(t.ctx.dataSource);
    const me = landlord.officer;
    const monday = await makeCase(landlord.home, { assignee: me, stage: "summary", dueAt: "2024-12-30T12:00:00.000Z" }, me);
    const tuesday = await makeCase(landlord.home, { assignee: me, stage: "safety-work", dueAt: "2024-12-31T09:00:00.000Z" }, me);

    // Tue 24 Dec: day 1 is Fri 27 (25 and 26 are bank holidays), day 2 is Mon 30 (after the weekend).
    await sendDue("2024-12-24T08:00:00Z");
    expect(mailsTo(me)).toHaveLength(1);
    const christmasEve = mailsTo(me)[0]!.raw;
    expect(christmasEve).toContain(`${monday.reference},`);
    expect(christmasEve).not.toContain(`${tuesday.reference},`);
    expect(christmasEve).toContain("by the end of Monday 30 December 2024");

    // No digest on the bank holidays themselves.
    expect(await sendDue("2024-12-25T08:00:00Z")).toMatchObject({ workingDay: false, sent: 0 });
    expect(await sendDue("2024-12-26T08:00:00Z")).toMatchObject({ workingDay: false, sent: 0 });
    expect(mailsTo(me)).toHaveLength(1);

    // Fri 27 Dec is a working day: a new day's digest, whose window now reaches Tue 31.
    await sendDue("2024-12-27T08:00:00Z");
    expect(mailsTo(me)).toHaveLength(2);
    expect(mailsTo(me)[1]!.raw).toContain(`${tuesday.reference},`);
  });

  it("the scheduler sends from 07:00 London time, once a day", async () => {
    const landlord = await makeLandlord(t.ctx.dataSource);
    await makeCase(landlord.home, { assignee: landlord.officer, dueAt: "2024-12-11T23:59:59.999Z" }, landlord.officer);
    let now = new Date("2024-12-10T06:55:00Z"); // 06:55 in London (GMT)
    const scheduler = startDigestScheduler(
      // Stale triage figures are worked out for this test's landlord only, so other files' cases are left alone.
      {
        digest: t.ctx.services.digest,
        triage: { refreshStale: (_org, limit) => t.ctx.services.triage.refreshStale(landlord.org.id, limit) },
      },
      t.ctx.logger,
      { clock: () => now, intervalMs: 3_600_000, firstCheckMs: 3_600_000 },
    );
    try {
      await scheduler.check();
      expect(mailsTo(landlord.officer)).toHaveLength(0);
      now = new Date("2024-12-10T07:00:00Z");
      await scheduler.check();
      await mailSettled(t);
      expect(mailsTo(landlord.officer)).toHaveLength(1);
      now = new Date("2024-12-10T07:10:00Z");
      await scheduler.check();
      await mailSettled(t);
      expect(mailsTo(landlord.officer)).toHaveLength(1);
    } finally {
      scheduler.stop();
    }
  });
});
