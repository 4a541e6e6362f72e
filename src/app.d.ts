// See https://svelte.dev/docs/kit/types#app.d.ts
import type { SessionUser } from '$lib/types/session-user';

declare global {
  namespace App {
    interface Error {
      message: string;
      /** Stable dotted code for expected failures (`project.not-found`), `internal` otherwise. */
      code?: string;
      /** Set on unexpected errors: the id logged with the stack trace. */
      errorId?: string;
    }
    interface Locals {
      /** The signed-in user, re-read from the database on each request; null when signed out. */
      user: SessionUser | null;
    }
    // interface PageData {}
    // interface PageState {}
    // interface Platform {}
  }
}

export {};
