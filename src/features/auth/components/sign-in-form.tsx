import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { SignInSchema, type SignInInput } from "@shared/schemas/auth";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { ApiError } from "@/lib/api-client";
import { useSignIn } from "../api/sign-in";

/** User name and password; Enter submits; the server's refusal shows above the button. */
export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const signIn = useSignIn();
  const form = useForm<SignInInput>({
    resolver: zodResolver(SignInSchema),
    defaultValues: { username: "", password: "" },
  });
  const { errors } = form.formState;
  const serverError =
    signIn.error instanceof ApiError
      ? signIn.error.message
      : signIn.error
        ? "Sign-in failed; try again"
        : undefined;
  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      onSubmit={form.handleSubmit((values) => signIn.mutate(values, { onSuccess: onSignedIn }))}
    >
      <Field label="User name" error={errors.username?.message}>
        {({ id, describedBy, invalid }) => (
          <Input
            id={id}
            autoComplete="username"
            autoFocus
            aria-describedby={describedBy}
            invalid={invalid}
            {...form.register("username")}
          />
        )}
      </Field>
      <Field label="Password" error={errors.password?.message}>
        {({ id, describedBy, invalid }) => (
          <Input
            id={id}
            type="password"
            autoComplete="current-password"
            aria-describedby={describedBy}
            invalid={invalid}
            {...form.register("password")}
          />
        )}
      </Field>
      {serverError && (
        <p role="alert" className="rounded border border-fail-100 bg-fail-50 px-3 py-2 text-sm text-fail-700">
          {serverError}
        </p>
      )}
      <Button type="submit" variant="primary" busy={signIn.isPending} className="w-full">
        Sign in
      </Button>
    </form>
  );
}
