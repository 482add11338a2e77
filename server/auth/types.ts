import type { SessionUser } from "../../shared/schemas/auth";

// Passport puts the deserialized user on req.user; tell Express's types what it holds.
declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}

export {};
