import Link from "next/link";

export const metadata = { title: "Check your e-mail" };

export default function CheckEmailPage() {
  return (
    <>
      <h1 className="text-figure font-bold">Check your e-mail</h1>
      <p className="mt-3">
        If the address has a Tautline account, a sign-in link is on its way. It works once and expires in 15 minutes.
      </p>
      <p className="mt-6">
        <Link href="/sign-in">Back to sign in</Link>
      </p>
    </>
  );
}
