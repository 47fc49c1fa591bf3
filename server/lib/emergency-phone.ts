// Where the landlord's emergency telephone line comes from (the policy module), as the services that
// write to tenants need it. An interface here, so cases and inspections need not import policy.
import type { EntityManager } from "typeorm";

export interface EmergencyPhoneSource {
  /** The organisation's emergency line as its admin wrote it, or null when none is set. */
  emergencyPhoneOf(organisationId: number, m?: EntityManager): Promise<string | null>;
}
