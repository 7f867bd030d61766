/// <reference path="../.astro/types.d.ts" />
/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    /** The signed-in user, set by middleware from the session; null when signed out. */
    actor: import('./lib/server/access').Actor | null;
    /** Nonce-free per-request id for log lines. */
    requestId: string;
  }
}
