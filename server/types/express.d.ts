import type { Principal } from '../services/principal';

declare global {
  namespace Express {
    interface Request {
      /** Set by the authenticate middleware; every /api route but health, login and invitations needs it. */
      principal?: Principal;
    }
  }
}

export {};
