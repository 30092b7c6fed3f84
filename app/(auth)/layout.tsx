import { Wordmark } from "@/components/mark";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 px-5 py-10">
      <Wordmark />
      {children}
      <p className="text-sm text-ink-soft">Job tracking for truck upfit shops: every wet kit, tank and wiring job from the bench to pickup.</p>
    </main>
  );
}
