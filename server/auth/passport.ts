import passport from "passport";
import { Strategy as LocalStrategy } from "passport-local";
import { QueryTypes } from "sequelize";
import { sequelize } from "../db.js";
import { User } from "../models/index.js";
import { verifyPassword } from "./passwords.js";

// A fixed hash so that unknown e-mails cost the same time as wrong passwords.
const DUMMY_HASH = "scrypt$32768$8$1$AAAAAAAAAAAAAAAAAAAAAA==$" + Buffer.alloc(64).toString("base64");

passport.use(
  new LocalStrategy({ usernameField: "email", passwordField: "password" }, (email, password, done) => {
    // Passport's callback style: the promise settles into done(), errors included.
    void (async () => {
      // The route already normalised the address (emailSchema); one normalisation for limiter and sign-in.
      const user = await User.findOne({ where: { email } });
      const ok = await verifyPassword(password, user?.passwordHash ?? DUMMY_HASH);
      return !user || !ok || !user.isActive ? false : user;
    })().then(
      (user) => done(null, user),
      (err: unknown) => done(err),
    );
  }),
);

passport.serializeUser((user, done) => done(null, (user as User).id));
passport.deserializeUser((id: string, done) => {
  // Every signed-in request: plain SQL mapped onto the model (findByPk's query building cost more than the query).
  sequelize
    .query<User>(`SELECT * FROM users WHERE id = :id`, { replacements: { id }, type: QueryTypes.SELECT, model: User, mapToModel: true })
    .then(
      ([user]) => done(null, user && user.isActive ? user : false),
      (err: unknown) => done(err),
    );
});

export { passport };
