import { SignInForm } from "@/components/auth/SignInForm";

export const metadata = { title: "Sign in" };

export default function SignInPage() {
  return (
    <>
      <h1 className="mb-4">Sign in</h1>
      <SignInForm />
    </>
  );
}
