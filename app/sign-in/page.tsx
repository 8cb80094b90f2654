import { redirect } from "next/navigation";
import { getCurrentSession } from "@/lib/auth/session";
import { SafetyNote } from "@/app/_components/safety-note";
import { SignInForm } from "./sign-in-form";

export const metadata = { title: "Sign in" };

export default async function SignInPage() {
  const { user } = await getCurrentSession();
  if (user) redirect("/");
  return (
    <main className="mx-auto flex min-h-screen max-w-sm flex-col justify-center gap-6 px-4">
      <div className="flex items-center gap-2 text-2xl font-semibold tracking-tight">
        <span aria-hidden className="inline-block h-5 w-5 rounded-sm bg-copper" />
        Ordwise
      </div>
      <SignInForm />
      <SafetyNote compact />
    </main>
  );
}
