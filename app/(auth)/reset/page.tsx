import Link from "next/link";
import { RequestResetForm } from "./RequestResetForm";

export const metadata = { title: "Reset your password" };

export default function ResetPage() {
  return (
    <>
      <h1 className="mb-2">Reset your password</h1>
      <p className="mb-4 text-sm text-slate-700">We send a single-use link to your address. It expires after one hour.</p>
      <RequestResetForm />
      <p className="mt-4 text-sm"><Link href="/signin">Back to sign-in</Link></p>
    </>
  );
}
