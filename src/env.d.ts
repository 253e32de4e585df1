/// <reference path="../.astro/types.d.ts" />

declare namespace App {
  interface Locals {
    /** The signed-in person with their roles, or null. */
    user: import('./lib/auth/roles').SessionUser | null;
  }
}
