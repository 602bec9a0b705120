import passport from 'passport';
import { User } from '../models';

interface SessionUser {
  id: number;
  epoch: number;
}

let configured = false;

/**
 * Sessions keep only the account id and its session epoch; a password or role change
 * bumps the epoch, which ends every older session at its next request.
 */
export function configurePassport() {
  if (configured) return;
  configured = true;
  passport.serializeUser((user, done) => {
    const u = user as Express.User & { sessionEpoch?: number };
    done(null, { id: u.id, epoch: u.sessionEpoch ?? 0 } satisfies SessionUser);
  });
  passport.deserializeUser((stored: SessionUser, done) => {
    User.findByPk(stored?.id)
      .then((user) => {
        if (!user || user.sessionEpoch !== stored.epoch) return done(null, false);
        done(null, user.toPublic());
      })
      .catch((err) => done(err));
  });
}
