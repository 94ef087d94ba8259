import { NewPasswordForm } from "@/components/auth/reset-password-forms";

export const metadata = { title: "Choose a new password" };

export default async function NewPasswordPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  return (
    <>
      <h1 className="text-figure font-bold">Choose a new password</h1>
      <div className="mt-6">
        <NewPasswordForm token={token} />
      </div>
    </>
  );
}
