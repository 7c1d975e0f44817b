import { SetPasswordForm } from "./SetPasswordForm";

export const metadata = { title: "Choose a password" };

export default async function SetPasswordPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  return (
    <>
      <h1 className="mb-4">Choose a password</h1>
      <SetPasswordForm token={token} />
    </>
  );
}
