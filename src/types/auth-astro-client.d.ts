// auth-astro's client imports its option types from next-auth/react, which it does not
// install. These are the fields its signIn/signOut read (auth-astro/client.ts).
declare module 'next-auth/react' {
  export type LiteralUnion<T extends U, U = string> = T | (U & Record<never, never>);
  export interface SignInOptions extends Record<string, unknown> {
    callbackUrl?: string;
    redirect?: boolean;
  }
  export type SignInAuthorizationParams = string | string[][] | Record<string, string> | URLSearchParams;
  export interface SignOutParams {
    callbackUrl?: string;
    redirect?: boolean;
  }
}

declare module 'set-cookie-parser';
