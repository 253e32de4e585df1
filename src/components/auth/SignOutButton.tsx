import { signOut } from 'auth-astro/client';

export default function SignOutButton() {
  return (
    <button
      type="button"
      onClick={() => signOut({ callbackUrl: '/signin' })}
      className="rounded border border-paper/40 px-2 py-1 hover:bg-copper"
    >
      Sign out
    </button>
  );
}
