import type { User as UserModel } from "./models/User.js";
import type { Membership } from "./models/Membership.js";
import type { Production } from "./models/Production.js";

declare global {
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends UserModel {}
    interface Request {
      /** Set by loadProduction for every /api/productions/:productionId/... route. */
      membership?: Membership;
      production?: Production;
    }
  }
}
export {};
