import type { AuthContext } from '../middlewares/authenticate';
import type { SessionClaims } from '../services/sessions';

declare global {
  namespace Express {
    interface Request {
      /** Set by `authenticate`: the signed-in user, their organization and session. */
      auth?: AuthContext;
      /** Set by `requireClaims`: the session cookie's verified claims, before the session is checked. */
      claims?: SessionClaims;
    }
  }
}
export {};
