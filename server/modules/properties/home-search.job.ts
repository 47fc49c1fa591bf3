import type { Logger } from "../../lib/logger.js";
import { leasedJob, type LeasedJobOptions } from "../../lib/repeating-job.js";
import type { HomeSearchService } from "./home-search.service.js";

/** The job's name in logs and its lease (one instance at a time runs it). */
export const HOME_SEARCH_JOB = "home-search-backlog";
const EVERY_MS = 15_000;

/**
 * Writes the search pieces of homes a bulk write (the stock import) left in the backlog: at start (what
 * the last process left) and then every 15 s. Until it has, the search tests those homes one by one, so
 * it is right all along and only slower. Returns a stop function.
 */
export function startHomeSearchCatchUp(
  homeSearch: Pick<HomeSearchService, "catchUp">,
  logger: Logger,
  { everyMs = EVERY_MS, leases }: LeasedJobOptions = {},
): () => Promise<void> {
  return leasedJob(HOME_SEARCH_JOB, {
    leases,
    everyMs,
    logger,
    atStart: true,
    failure: `${HOME_SEARCH_JOB}: writing search pieces failed`,
    run: () => homeSearch.catchUp(),
  }).stop;
}
