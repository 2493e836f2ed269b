import { expect, test } from "@playwright/test";
import { signInAs } from "./fixtures";

test("an operator opening the admin page gets the forbidden page", async ({ page, context, baseURL }) => {
  await signInAs(context, baseURL!, "operator");
  const response = await page.goto("/admin/users");
  expect(response?.status()).toBe(403);
  await expect(page.getByRole("heading", { name: "Not open to your role" })).toBeVisible();
});

test("an admin adds a person, that person signs in, and deactivation signs them out at once", async ({ page, context, baseURL, browser }) => {
  await signInAs(context, baseURL!, "admin");
  await page.goto("/admin/users");
  const email = `new.tech.${Date.now()}@brackwater.example`;
  const form = page.getByRole("form", { name: "Add a person" });

  // Bad input first: a short password is refused next to its field and nothing is created.
  await form.getByLabel("Name").fill("Noor Newcomer");
  await form.getByLabel("E-mail").fill(email);
  await form.getByLabel("First password").fill("short");
  await form.getByRole("button", { name: "Add person" }).click();
  await expect(form.getByText(/Use at least 12 characters/)).toBeVisible();
  await expect(page.getByTestId(`user-${email}`)).toHaveCount(0);

  await form.getByLabel("Name").fill("Noor Newcomer");
  await form.getByLabel("E-mail").fill(email);
  await form.getByLabel("First password").fill("a long first password");
  await form.getByRole("button", { name: "Add person" }).click();
  await expect(form.getByRole("status")).toContainText("can now sign in");
  await expect(page.getByTestId(`user-${email}`)).toContainText("Operator");

  // The new operator signs in in a separate browser.
  const other = await browser.newContext();
  const theirPage = await other.newPage();
  await theirPage.goto("/sign-in");
  await theirPage.getByLabel("E-mail").fill(email);
  await theirPage.getByLabel("Password").fill("a long first password");
  await theirPage.getByRole("button", { name: "Sign in" }).click();
  await expect(theirPage.getByTestId("signed-in-name")).toHaveText("Noor Newcomer");

  // Issue 13 item 14 / issue 11: the admin sets a new password; a weak one is refused, and a good one
  // signs the person out everywhere at once.
  const row = page.getByTestId(`user-${email}`);
  await row.getByLabel("New password for Noor Newcomer").fill("aaaaaaaaaaaa");
  await row.getByRole("button", { name: "Set the typed password as Noor Newcomer's password" }).click();
  await expect(row.getByRole("alert")).toContainText("more than one or two different characters");
  await row.getByLabel("New password for Noor Newcomer").fill("harbour lamp copper tray");
  await row.getByRole("button", { name: "Set the typed password as Noor Newcomer's password" }).click();
  await expect(row.getByRole("status")).toContainText("Noor Newcomer has a new password; 1 session was signed out.");
  await theirPage.reload();
  await expect(theirPage).toHaveURL(/\/sign-in/);
  await theirPage.getByLabel("E-mail").fill(email);
  await theirPage.getByLabel("Password").fill("harbour lamp copper tray");
  await theirPage.getByRole("button", { name: "Sign in" }).click();
  await expect(theirPage.getByTestId("signed-in-name")).toHaveText("Noor Newcomer");

  await page.getByTestId(`user-${email}`).getByRole("button", { name: "Deactivate Noor Newcomer" }).click();
  await expect(page.getByTestId(`user-${email}`)).toContainText("deactivated");

  await theirPage.reload();
  await expect(theirPage).toHaveURL(/\/sign-in/);
  await other.close();

  await page.goto("/audit?action=user.");
  await expect(page.getByRole("cell", { name: "deactivated a user" }).first()).toBeVisible();
});
