/**
 * The time zone of each site: pages show times in it and forms read typed times in it. Only display and
 * entry change with it; stored times stay UTC, and so do the API and CSV formats.
 * Services take the Prisma client as their first argument (see DEVELOPERS.md, "Services and server-only").
 */
import { ZSiteZoneInput, type TSiteZoneInput } from "@/shared/intake";
import type { PrismaClient } from "@/src/db/connect";
import { AppError, parseInput } from "@/src/errors";

export interface TSiteZone {
  readonly id: number;
  readonly name: string;
  readonly zone: string;
  /** Processes of the site, through its areas: a page showing a process's times finds its zone here. */
  readonly processIds: readonly number[];
}

/** Every site with its zone, in name order. */
export async function siteZones(db: PrismaClient): Promise<TSiteZone[]> {
  const sites = await db.site.findMany({
    select: { id: true, name: true, zone: true, areas: { select: { processes: { select: { id: true } } } } },
    orderBy: { name: "asc" },
  });
  return sites.map(({ areas, ...site }) => ({ ...site, processIds: areas.flatMap((area) => area.processes.map((process) => process.id)) }));
}

/** The zone of the site a process belongs to. */
export async function zoneOfProcess(db: PrismaClient, processId: number): Promise<string> {
  const process = await db.process.findUnique({ where: { id: processId }, select: { area: { select: { site: { select: { zone: true } } } } } });
  if (process === null) throw new AppError("not-found", `Process ${processId} does not exist`);
  return process.area.site.zone;
}

/** Sets a site's zone; an unknown zone or site changes nothing. */
export async function setSiteZone(db: PrismaClient, input: TSiteZoneInput): Promise<{ id: number; name: string; zone: string }> {
  const { siteId, zone } = parseInput(ZSiteZoneInput, input, "site time zone");
  if ((await db.site.count({ where: { id: siteId } })) === 0) {
    throw new AppError("not-found", `Site ${siteId} does not exist`, [{ path: "siteId", message: "does not exist" }]);
  }
  return db.site.update({ where: { id: siteId }, data: { zone }, select: { id: true, name: true, zone: true } });
}
