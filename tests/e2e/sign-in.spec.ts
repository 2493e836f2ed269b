import { expect, test } from "@playwright/test";
import { DEMO_USERS } from "@/scenarios/demo-lab";

// Only this spec signs in through the form; the others start with a session (fixtures.ts).
const LAB = ["Runs", "Lots", "Specimens", "Compare discharges", "Instruments"];
const NAV: Record<string, string[]> = {
  admin: ["Home", "Procedures", "Cell specifications", ...LAB, "Certificates", "Audit trail", "Users", "E-mail", "Signing key", "Integrity", "Cycler tokens"],
  engineer: ["Home", "Procedures", "Cell specifications", ...LAB, "Certificates"],
  operator: ["Home", "Procedures", "Cell specifications", ...LAB],
  auditor: ["Home", "Procedures", "Cell specifications", ...LAB, "Certificates", "Audit trail"],
};

for (const user of DEMO_USERS.filter((u, i, all) => all.findIndex((x) => x.role === u.role) === i)) {
  test(`${user.role} signs in through the form and sees their own navigation`, async ({ page }) => {
    await page.goto("/");
    await expect(page).toHaveURL(/\/sign-in/);
    await page.getByLabel("E-mail").fill(user.email);
    await page.getByLabel("Password").fill(user.password);
    await page.getByRole("button", { name: "Sign in" }).click();
    await expect(page.getByTestId("signed-in-name")).toHaveText(user.displayName);
    const nav = page.getByRole("navigation", { name: "Workbench sections" });
    await expect(nav.getByRole("link")).toHaveText(NAV[user.role]!);
  });
}

test("a wrong password is refused with a plain message and no session", async ({ page, context }) => {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill("auditor@brackwater.example");
  await page.getByLabel("Password").fill("not the password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "Not signed in" })).toContainText("The e-mail address or the password is not right.");
  const cookies = await context.cookies();
  expect(cookies.find((c) => c.name === "cellwright_session")?.value ?? "").toBe("");
});

test("sign-out ends the session: the back button does not bring the workbench back", async ({ page }) => {
  const operator = DEMO_USERS.find((u) => u.role === "operator")!;
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(operator.email);
  await page.getByLabel("Password").fill(operator.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("signed-in-name")).toBeVisible();
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page.getByText("You have signed out.")).toBeVisible();
  await page.goto("/");
  await expect(page).toHaveURL(/\/sign-in/);
});

test("a sign-in link cannot send the user to another site", async ({ page }) => {
  const engineer = DEMO_USERS.find((u) => u.role === "engineer")!;
  await page.goto("/sign-in?next=//evil.example/");
  await page.getByLabel("E-mail").fill(engineer.email);
  await page.getByLabel("Password").fill(engineer.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("signed-in-name")).toBeVisible();
  expect(new URL(page.url()).host).toBe(new URL(test.info().project.use.baseURL!).host);
});

// Issue 11 row 1: `/sign-in?next=%2F%5Cevil.example` ended at http://evil.example/ (browsers read `/\host` as `//host`).
test("a sign-in link with a backslash path cannot send the user to another site either", async ({ page, baseURL }) => {
  const auditor = DEMO_USERS.find((u) => u.role === "auditor")!;
  await page.goto("/sign-in?next=%2F%5Cevil.example");
  await page.getByLabel("E-mail").fill(auditor.email);
  await page.getByLabel("Password").fill(auditor.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("signed-in-name")).toBeVisible();
  expect(new URL(page.url()).host).toBe(new URL(baseURL!).host);
});

// Issue 11 row 10: the cookie lived 400 days while the session ends after 12 hours.
test("the session cookie expires with the session, not 400 days later", async ({ page, context }) => {
  const operator = DEMO_USERS.find((u) => u.role === "operator")!;
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(operator.email);
  await page.getByLabel("Password").fill(operator.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("signed-in-name")).toBeVisible();
  const cookie = (await context.cookies()).find((c) => c.name === "cellwright_session")!;
  const hoursLeft = (cookie.expires * 1000 - Date.now()) / 3_600_000;
  expect(hoursLeft).toBeGreaterThan(11);
  expect(hoursLeft).toBeLessThanOrEqual(12.01);
});
