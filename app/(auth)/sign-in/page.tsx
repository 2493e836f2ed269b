import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { Notice } from "@/components/ui/notice";
import { requirePageAccess } from "@/lib/auth/guards";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string; ended?: string }> }) {
  const [{ next, ended }, signedIn] = await Promise.all([searchParams, requirePageAccess("/sign-in")]);
  if (signedIn) redirect("/");
  return (
    <section className="rounded border border-rule bg-white p-6 shadow-sm">
      <h1 className="mb-1 text-xl font-bold">Sign in to the workbench</h1>
      <p className="mb-5 text-sm text-ink-soft">Use the account your lab&apos;s administrator gave you.</p>
      {ended === "1" && (
        <div className="mb-4">
          <Notice tone="info" title="Signed out">
            You have signed out. Close the browser if this is a shared bench computer.
          </Notice>
        </div>
      )}
      {next && ended !== "1" && (
        <div className="mb-4">
          <Notice tone="info" title="Sign in to continue">
            That page needs you to be signed in; your session may have ended.
          </Notice>
        </div>
      )}
      <SignInForm next={next} />
    </section>
  );
}
