"use client";

/**
 * next-auth's client (about 12 KB gzip) loads when the button is pressed, not with every office
 * page: the navigation that holds this button is on all of them.
 */
async function signOut() {
  const { signOut: send } = await import("next-auth/react");
  await send({ callbackUrl: "/sign-in" });
}

export function SignOutButton() {
  return (
    <button type="button" className="btn-quiet" onClick={() => void signOut()}>
      Sign out
    </button>
  );
}
