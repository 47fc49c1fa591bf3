import { createHash, randomBytes, timingSafeEqual } from "node:crypto";
import type { DataSource } from "typeorm";
import type { ApiScope } from "../../../src/lib/contracts/integrations.js";
import type { ApiKeyCreateInput } from "../../../src/lib/schemas/api-keys.js";
import type { Actor } from "../../lib/actor.js";
import type { Clock } from "../../lib/clock.js";
import { NotFoundError, UnauthorizedError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import type { Person } from "../users/user.service.js";
import { inTransaction } from "../../lib/transaction.js";
import type { AdminActionService } from "./admin-action.service.js";
import { ApiKeyAuditEntry } from "./api-key-audit.entity.js";
import { ApiKey } from "./api-key.entity.js";

export type { ApiKey } from "./api-key.entity.js";
export type { ApiKeyAuditEntry } from "./api-key-audit.entity.js";

/** What this module needs of the users module: the key's admin, still active, and people's names. */
export interface KeyPeople {
  findStaff(organisationId: number, id: number, roles: readonly ["admin"]): Promise<Person | null>;
  people(ids: readonly number[]): Promise<Map<number, Person>>;
}

/** A key-authenticated request: the key, and the actor the services see. */
export interface KeyCaller {
  key: ApiKey;
  actor: Actor;
}

/** `dwk_<id>_<43 base64url characters>` (32 random bytes). */
const KEY_PATTERN = /^dwk_([1-9][0-9]{0,9})_([A-Za-z0-9_-]{43})$/;
const LAST_USED_GRANULARITY_MS = 60_000;
const AUDIT_PAGE = 200;

/**
 * SHA-256, unsalted: the secret is 32 bytes from the operating system's random source (256 bits), so
 * there is no dictionary to try and no two secrets alike; a slow password hash (argon2) protects
 * low-entropy passwords and would only cost CPU on every request here.
 */
const hashSecret = (secret: string) => createHash("sha256").update(secret, "utf8").digest("hex");

export const keyHint = (key: Pick<ApiKey, "id">) => `dwk_${key.id}_…`;

const refused = () => new UnauthorizedError("This API key is not valid: it is unknown, revoked, or its admin no longer is one.");

export class ApiKeyService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly people: KeyPeople,
    private readonly clock: Clock,
    private readonly adminActions: AdminActionService,
    private readonly logger?: Logger,
  ) {}

  /** Admin: a new key for the actor's landlord, recorded with who made it. The secret is in the answer and nowhere else. */
  async create(actor: Actor, input: ApiKeyCreateInput): Promise<{ key: ApiKey; secret: string }> {
    const random = randomBytes(32).toString("base64url");
    const key = await inTransaction(this.dataSource, async (m) => {
      const repo = m.getRepository(ApiKey);
      const saved = await repo.save(
        repo.create({
          organisationId: actor.organisationId,
          name: input.name,
          scopes: input.scopes,
          secretHash: hashSecret(random),
          createdByUserId: actor.id,
          createdAt: this.clock.now(),
          lastUsedAt: null,
          revokedAt: null,
          revokedByUserId: null,
        }),
      );
      await this.adminActions.record(m, actor, {
        action: "api-key-created",
        subjectId: saved.id,
        detail: `"${saved.name}" (${keyHint(saved)}), scopes: ${saved.scopes.join(", ")}`,
      });
      return saved;
    });
    this.logger?.info(
      { audit: "api-key-created", actorId: actor.id, organisationId: actor.organisationId, apiKeyId: key.id, scopes: key.scopes },
      "audit: api-key-created",
    );
    return { key, secret: `dwk_${key.id}_${random}` };
  }

  /** Admin: the landlord's keys, newest first, with the names of who made them. */
  async list(actor: Actor): Promise<{ keys: ApiKey[]; people: Map<number, Person> }> {
    const keys = await this.dataSource
      .getRepository(ApiKey)
      .find({ where: { organisationId: actor.organisationId }, order: { id: "DESC" } });
    return { keys, people: await this.people.people(keys.map((k) => k.createdByUserId)) };
  }

  /** Admin: refuses the key from now on (again is harmless and not recorded again); 404 for another landlord's key. */
  async revoke(actor: Actor, id: number): Promise<{ key: ApiKey; people: Map<number, Person> }> {
    const { key, revoked } = await inTransaction(this.dataSource, async (m) => {
      const repo = m.getRepository(ApiKey);
      const key = await repo.findOne({
        where: { id, organisationId: actor.organisationId },
        lock: { mode: "pessimistic_write" },
      });
      if (!key) throw new NotFoundError("No such API key.");
      if (key.revokedAt) return { key, revoked: false };
      key.revokedAt = this.clock.now();
      key.revokedByUserId = actor.id;
      await repo.update({ id }, { revokedAt: key.revokedAt, revokedByUserId: actor.id });
      await this.adminActions.record(m, actor, {
        action: "api-key-revoked",
        subjectId: id,
        detail: `"${key.name}" (${keyHint(key)})`,
      });
      return { key, revoked: true };
    });
    if (revoked) {
      this.logger?.info(
        { audit: "api-key-revoked", actorId: actor.id, organisationId: actor.organisationId, apiKeyId: id },
        "audit: api-key-revoked",
      );
    }
    return { key, people: await this.people.people([key.createdByUserId]) };
  }

  /**
   * The caller behind `Authorization: Bearer <key>`, or 401. Read from the database on every request
   * (no cache), so a revoked key is refused at once. The key acts as the admin who made it, with an
   * officer's powers and only its scopes (checked per route), and only while that admin is still an
   * active admin of the landlord.
   */
  async authenticate(authorization: string | undefined): Promise<KeyCaller> {
    const match = /^Bearer (\S+)$/.exec(authorization ?? "");
    const parts = match ? KEY_PATTERN.exec(match[1]!) : null;
    if (!parts) throw new UnauthorizedError("Send an API key as `Authorization: Bearer dwk_…`.");
    const key = await this.dataSource.getRepository(ApiKey).findOneBy({ id: Number(parts[1]) });
    const expected = key ? Buffer.from(key.secretHash, "hex") : Buffer.alloc(32);
    const given = Buffer.from(hashSecret(parts[2]!), "hex");
    if (!key || !timingSafeEqual(expected, given) || key.revokedAt) throw refused();
    const admin = await this.people.findStaff(key.organisationId, key.createdByUserId, ["admin"]);
    if (!admin) throw refused();
    await this.touch(key);
    return {
      key,
      actor: {
        id: admin.id,
        email: admin.email,
        name: `${admin.name} (API key "${key.name}")`,
        role: "officer",
        organisationId: key.organisationId,
      },
    };
  }

  /** Last used, at most once a minute per key (the WHERE keeps it so across instances too). */
  private async touch(key: ApiKey): Promise<void> {
    const now = this.clock.now();
    if (key.lastUsedAt && now.getTime() - key.lastUsedAt.getTime() < LAST_USED_GRANULARITY_MS) return;
    await this.dataSource
      .getRepository(ApiKey)
      .createQueryBuilder()
      .update()
      .set({ lastUsedAt: now })
      .where("id = :id AND (last_used_at IS NULL OR last_used_at <= :cut)", {
        id: key.id,
        cut: new Date(now.getTime() - LAST_USED_GRANULARITY_MS),
      })
      .execute();
    key.lastUsedAt = now;
  }

  /** Whether the key holds the scope. */
  allows(key: ApiKey, scope: ApiScope): boolean {
    return key.scopes.includes(scope);
  }

  /** One write made with a key, after its answer. */
  async recordWrite(key: ApiKey, write: { method: string; path: string; status: number }): Promise<void> {
    await this.dataSource.getRepository(ApiKeyAuditEntry).insert({
      organisationId: key.organisationId,
      apiKeyId: key.id,
      method: write.method,
      path: write.path.slice(0, 300),
      status: write.status,
      createdAt: this.clock.now(),
    });
  }

  /** Admin: the latest writes made with the landlord's keys, newest first. */
  async audit(actor: Actor): Promise<{ entries: ApiKeyAuditEntry[]; names: Map<number, string> }> {
    const entries = await this.dataSource
      .getRepository(ApiKeyAuditEntry)
      .find({ where: { organisationId: actor.organisationId }, order: { id: "DESC" }, take: AUDIT_PAGE });
    const keys = await this.dataSource
      .getRepository(ApiKey)
      .find({ where: { organisationId: actor.organisationId }, select: { id: true, name: true } });
    return { entries, names: new Map(keys.map((k) => [k.id, k.name])) };
  }
}
