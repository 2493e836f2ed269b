import type { ReactNode } from "react";

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <main className="flex min-h-screen items-center justify-center px-4 py-12">
      <div className="w-full max-w-md">
        <p className="mb-6 text-center font-serif text-3xl font-bold">
          Cell<span className="text-copper">wright</span>
        </p>
        {children}
      </div>
    </main>
  );
}
