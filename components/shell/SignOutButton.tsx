"use client";

import { signOut } from "next-auth/react";

export function SignOutButton() {
  return (
    <button
      type="button"
      onClick={() => signOut({ callbackUrl: "/signin" })}
      className="text-xs text-stone-400 underline-offset-2 hover:text-white hover:underline"
    >
      Sign out
    </button>
  );
}
