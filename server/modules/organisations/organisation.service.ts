import type { DataSource, EntityManager } from "typeorm";
import type { Actor } from "../../lib/actor.js";
import { ConflictError } from "../../lib/errors.js";
import { parse } from "../../lib/validation.js";
import { Organisation } from "./organisation.entity.js";
import { landlordInputSchema, type LandlordInput } from "./organisation.schemas.js";

/**
 * What adding a landlord needs from the owners of accounts (UserService) and of invitations
 * (AuthService). Described here rather than imported: both modules import this one, so importing
 * them back would make a circle.
 */
export interface LandlordOnboarding {
  accounts: {
    organisationOfEmail(email: string, m: EntityManager): Promise<number | null>;
    createInvited(
      m: EntityManager,
      input: { organisationId: number; email: string; name: string; role: "admin" },
    ): Promise<Actor>;
  };
  invitations: {
    /** The usual invitation (link, token, audit entry, outbox row) in the caller's transaction; returns the sender. */
    releaseQueuedInvitation(m: EntityManager, inviter: Actor, userId: number, email: string): Promise<() => Promise<unknown>>;
  };
}

export interface AddedLandlord {
  organisationId: number;
  name: string;
  admin: { id: number; email: string; name: string };
}

/** Who the first administrator's invitation says it comes from: there is nobody at the landlord yet. */
const SET_UP_BY = "Dewline";

/** Landlords. Other modules ask here for a landlord's name rather than reading the table. */
export class OrganisationService {
  constructor(private readonly dataSource: DataSource) {}

  /** The landlord's name (inside the caller's transaction when given one). */
  async nameOf(id: number, m: EntityManager = this.dataSource.manager): Promise<string> {
    return (await m.getRepository(Organisation).findOneByOrFail({ id })).name;
  }

  /**
   * A fresh landlord (`npm run landlord:add`) and its first administrator, invited by e-mail: the
   * landlord, the account (no password), the invitation link and its outbox e-mail are written in one
   * transaction, so a refusal or a failure leaves nothing. No deadline policy row is written: a landlord
   * without one works to the default timeframes until an admin sets its own (as the demo landlords do).
   * After the commit this process's outbox relay is woken; the e-mail goes out oldest first with the rest
   * of the outbox, from here or from the running server's relay (which retries if the mail server is away).
   */
  async addLandlord(input: LandlordInput, onboarding: LandlordOnboarding): Promise<AddedLandlord> {
    const { name, adminEmail, adminName } = parse(landlordInputSchema, input);
    const { added, deliver } = await this.dataSource.transaction(async (m) => {
      // The FOR UPDATE read locks what it scans (the table has no index on name), so two runs adding the
      // same name wait for each other instead of both finding it free. The column's collation ignores case.
      const same = await m
        .getRepository(Organisation)
        .createQueryBuilder("o")
        .setLock("pessimistic_write")
        .where("TRIM(o.name) = :name", { name })
        .getOne();
      if (same) throw new ConflictError(`There is already a landlord called "${same.name}" (id ${same.id}).`);
      if ((await onboarding.accounts.organisationOfEmail(adminEmail, m)) !== null) {
        throw new ConflictError(
          `The address ${adminEmail} is already used by an account. Each account belongs to one landlord: use another address.`,
        );
      }
      const org = await m.getRepository(Organisation).save({ name });
      const admin = await onboarding.accounts.createInvited(m, {
        organisationId: org.id,
        email: adminEmail,
        name: adminName,
        role: "admin",
      });
      const deliver = await onboarding.invitations.releaseQueuedInvitation(
        m,
        { ...admin, name: SET_UP_BY },
        admin.id,
        admin.email,
      );
      return {
        added: { organisationId: org.id, name: org.name, admin: { id: admin.id, email: admin.email, name: admin.name } },
        deliver,
      };
    });
    await deliver();
    return added;
  }
}
