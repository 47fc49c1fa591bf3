// The admin's journey with people in Chromium, on a phone and on a laptop: invite a member of staff
// (the e-mail talks about the team, not "your home"), send the invitation again, change their role,
// disable and enable the account again (each after a confirmation), read the history, and open the
// case queue. axe-core on every page and dialog on the way.
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, type Browser } from "../support/browser.js";
import { consoleErrors, expectAccessible, horizontalOverflow, signIn, VIEWPORTS, type ViewportName } from "../support/journey.js";
import { serveDemoApp, type ServedApp } from "../support/served-app.js";
import { anonymousClient } from "../support/test-app.js";

let served: ServedApp;
let browser: Browser;

beforeAll(async () => {
  served = await serveDemoApp();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await served?.close();
});

const tokenIn = (raw: string) => /\/invitation\/([A-Za-z0-9_-]{43})/.exec(raw)?.[1];

/** Confirms the open dialog (after an axe-core scan of it) with the named button. */
async function confirmDialog(page: Page, title: string, button: string) {
  const dialog = page.getByRole("dialog", { name: title });
  await dialog.waitFor();
  await expectAccessible(page);
  await dialog.getByRole("button", { name: button }).click();
  await dialog.waitFor({ state: "hidden" });
}

describe.each(Object.keys(VIEWPORTS) as ViewportName[])("an admin manages people at %s size", (size) => {
  it("invites, resends, changes the role, disables and enables, then opens the queue", async () => {
    const page = await browser.context.newPage();
    await page.setViewportSize(VIEWPORTS[size]);
    const email = `jo.marsh.${size}@example.org`;
    const name = `Jo Marsh (${size})`;
    try {
      await signIn(page, served.url, "admin@example.org");
      // From here on (the sign-in page itself asks who is signed in, and is told 401).
      const errors = consoleErrors(page);
      await page.getByRole("heading", { level: 1, name: "Users and invitations" }).waitFor();
      await page.getByRole("table", { name: "People in your organisation" }).getByRole("row").nth(1).waitFor();
      await expectAccessible(page);
      expect(await horizontalOverflow(page)).toBe(0);

      // Invite a housing officer.
      const form = page.getByRole("region", { name: "Invite someone" });
      await form.getByLabel("Name").fill(name);
      await form.getByLabel("E-mail address").fill(email);
      await form.getByRole("combobox", { name: "Role" }).selectOption({ label: "Housing officer" });
      await form.getByRole("button", { name: "Send invitation" }).click();
      await form.getByText(`Invitation sent to ${email}`).waitFor();
      const first = await served.mail.lastTo(email);
      expect(first.raw).toContain("team on Dewline, as a housing officer");
      expect(first.raw).not.toMatch(/your home/i);

      // Find them and send the invitation again.
      await page.getByRole("searchbox", { name: "Search people" }).fill(email);
      await page.getByRole("searchbox", { name: "Search people" }).press("Enter");
      const table = page.getByRole("table", { name: "People in your organisation" });
      await table.getByRole("button", { name: `Manage ${name}` }).click();
      let panel = page.getByRole("region", { name });
      await panel.getByText("They have not accepted their invitation yet.").waitFor();
      await expectAccessible(page);
      await panel.getByRole("button", { name: "Send the invitation again" }).click();
      await confirmDialog(page, `Send ${name}'s invitation again?`, "Send it again");
      await panel.getByText(`The invitation went to ${email} again.`, { exact: false }).waitFor();
      await expect.poll(() => served.mail.mails.filter((m) => m.to.includes(email)).length).toBe(2);
      const second = (await served.mail.lastTo(email)).raw;
      const token = tokenIn(second)!;
      expect(token).not.toBe(tokenIn(first.raw));

      // They accept the new link (the old one no longer works).
      const anon = await anonymousClient(served.app);
      await anon.post("/api/auth/invitations/accept", { token: tokenIn(first.raw), password: "jo's long password" }).expect(404);
      await anon.post("/api/auth/invitations/accept", { token, password: "jo's long password" }).expect(204);

      // Back on the page: now active. Make them a maintenance lead.
      await page.reload();
      await table.getByRole("button", { name: `Manage ${name}` }).click();
      panel = page.getByRole("region", { name });
      await panel.getByText("Active", { exact: true }).waitFor();
      await panel.getByRole("combobox", { name: "Role" }).selectOption({ label: "Maintenance lead" });
      await panel.getByRole("button", { name: "Save changes" }).click();
      await confirmDialog(page, `Save changes to ${name}'s account?`, "Save changes");
      await panel.getByText(`${name}'s details are saved.`).waitFor();
      await table.getByRole("cell", { name: "Maintenance lead" }).waitFor();

      // Disable, then enable again.
      await panel.getByRole("button", { name: "Disable account" }).click();
      await confirmDialog(page, `Disable ${name}'s account?`, "Disable account");
      await panel.getByText(`${name}'s account is now disabled.`).waitFor();
      await panel.getByRole("button", { name: "Enable account" }).click();
      await confirmDialog(page, `Enable ${name}'s account?`, "Enable account");
      await panel.getByText(`${name}'s account is now enabled.`).waitFor();

      // The history says who did what.
      await panel.getByText("Morgan Castell changed the role from housing officer to maintenance lead.").waitFor();
      await panel.getByText("Morgan Castell disabled the account.").waitFor();
      await panel.getByText("Morgan Castell enabled the account again.").waitFor();
      await panel.getByText("Morgan Castell sent the invitation again with a new link.").waitFor();
      await expectAccessible(page);
      expect(await horizontalOverflow(page)).toBe(0);

      // The admin opens the case queue from the menu.
      await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Case queue" }).click();
      await page.getByRole("heading", { level: 1, name: "Case queue" }).waitFor();
      expect(await page.getByText("Not allowed").count()).toBe(0);
      await expectAccessible(page);

      expect(errors).toEqual([]);
      // Both sizes share the browser's cookies: sign out before the next one signs in.
      await page.getByRole("button", { name: "Sign out" }).click();
      await page.getByRole("heading", { level: 1, name: "Sign in" }).waitFor();
    } finally {
      await page.close();
    }
  });
});
