import 'express-session';
import type { PublicUser } from '../shared/schemas/auth';

declare global {
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends PublicUser {}
  }
}

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string;
    createdAt?: number;
  }
}
