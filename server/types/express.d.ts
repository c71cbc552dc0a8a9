import type { AuthContext } from '../middlewares/authenticate';

declare global {
  namespace Express {
    interface Request {
      /** Set by `authenticate`: the signed-in user, their organization and session. */
      auth?: AuthContext;
    }
  }
}
export {};
