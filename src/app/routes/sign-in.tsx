import { useNavigate, useSearchParams } from "react-router-dom";
import { Wordmark } from "@/components/brand/mark";
import { SignInForm } from "@/features/auth/components/sign-in-form";

/** Only same-site paths may be a return target, so a crafted link cannot send the user elsewhere. */
function safeNext(next: string | null): string {
  return next && next.startsWith("/") && !next.startsWith("//") && !next.startsWith("/sign-in") ? next : "/";
}

/** /sign-in: the form, then back to where the user was going. */
export function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const next = safeNext(params.get("next"));
  return (
    <main className="flex min-h-screen flex-col items-center justify-center bg-ink-900 px-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex justify-center text-white">
          <Wordmark />
        </div>
        <div className="rounded-md border border-paper-300 bg-paper-50 p-6 shadow-xl">
          <h1 className="mb-1 text-lg font-semibold text-ink-900">Sign in</h1>
          <p className="mb-5 text-sm text-ink-600">
            Fixed-point hand-off for pulse-compression waveforms and filters.
          </p>
          <SignInForm onSignedIn={() => navigate(next, { replace: true })} />
        </div>
      </div>
    </main>
  );
}
