// The Actor is defined in server/lib/actor.ts (below every module, so users, properties and
// tenancies need not import auth); re-exported here for the modules that import it from auth.
export { isStaff, type Actor } from "../../lib/actor.js";
