import type { Role } from '../src/domain/people/roles';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    /** What passport puts on req.user: the signed-in, active user. */
    interface User {
      id: number;
      teamId: number;
      email: string;
      name: string;
      roles: Role[];
      active: boolean;
    }
  }
}

export {};
