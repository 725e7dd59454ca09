// `npm run test:e2e`: the browser tests, against the real app started by the run command.
import assert from "node:assert/strict";
import { openBrowser, runSteps, shot, startApp } from "./harness";

const app = await startApp();
const browser = await openBrowser();
const { page } = browser;
const errors: string[] = [];
page.on("pageerror", (e) => errors.push(`pageerror: ${e.message}`));
page.on("response", (r) => {
  if (r.status() >= 400 && !r.url().includes("/api/")) errors.push(`http ${r.status()}: ${r.url()}`);
});
page.on("console", (m) => {
  if (m.type() === "error" && /Failed to load resource/.test(m.text())) return; // reported with its URL above

  if (m.type() === "error") errors.push(`console: ${m.text()}`);
});

const email = `ada.quill.${Date.now()}@example.org`;
const projectName = "Wednesday theory group";

const failures = await runSteps([
  ["landing page says what Tapernote does", async () => {
    await page.goto(app.baseUrl);
    await page.getByRole("link", { name: /create an account/i }).first().waitFor();
    assert.match(await page.textContent("body") ?? "", /cents/i);
    await shot(page, "01-landing");
  }],
  ["sign-up form shows field errors next to the fields", async () => {
    await page.goto(`${app.baseUrl}/sign-up`);
    await page.getByRole("button", { name: "Create account" }).click();
    await page.locator("#email-error").waitFor();
    assert.match(await page.locator("#password-error").textContent() ?? "", /8 characters/);
    await shot(page, "02-sign-up-errors");
  }],
  ["sign up", async () => {
    await page.fill("#name", "Ada Quill");
    await page.fill("#email", email);
    await page.fill("#password", "scales and arpeggios");
    await page.getByRole("button", { name: "Create account" }).click();
    await page.getByText("Check your e-mail").waitFor();
    await shot(page, "03-check-email");
  }],
  ["verify through the mailbox page", async () => {
    await page.goto(`${app.baseUrl}/dev/mailbox`);
    const mail = page.locator('[data-testid="mail"]', { hasText: email }).first();
    await mail.waitFor();
    await shot(page, "04-mailbox");
    await mail.locator("a").first().click();
    await page.waitForURL(/\/projects/);
    await page.getByRole("heading", { name: "Projects" }).waitFor();
    await page.getByText("No projects yet").waitFor();
    await shot(page, "05-projects-empty");
  }],
  ["create a project and see it in the table", async () => {
    await page.getByRole("button", { name: "New project" }).first().click();
    await page.getByRole("button", { name: "Create project" }).click();
    await page.locator("#project-name-error").waitFor();
    await page.fill("#project-name", projectName);
    await page.fill("#project-description", "Triads and inversions, autumn term.");
    await page.getByRole("button", { name: "Create project" }).click();
    await page.getByRole("link", { name: projectName }).waitFor();
    await shot(page, "06-projects-table");
  }],
  ["sign out", async () => {
    await page.getByRole("button", { name: "Sign out" }).first().click();
    await page.waitForURL(/\/sign-in/);
    await page.goto(`${app.baseUrl}/projects`);
    await page.waitForURL(/\/sign-in/);
    await shot(page, "07-signed-out");
  }],
  ["the demo owner sees the demo studio's members", async () => {
    await page.fill("#email", "owner@example.com");
    await page.fill("#password", "tapernote-demo");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(/\/projects/);
    await page.getByRole("link", { name: "Grade 3 chord exercises" }).waitFor();
    await page.goto(`${app.baseUrl}/members`);
    await page.getByText("listener@example.com").waitFor();
    await shot(page, "08-members");
  }],
  ["no CSP violations or page errors", async () => {
    assert.deepEqual(errors.filter((e) => !/favicon/.test(e)), []);
  }],
]);

await browser.close();
await app.stop();
process.exit(failures ? 1 : 0);
