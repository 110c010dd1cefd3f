// The characteristic named in a page's URL, or Next's not-found page: shared by the characteristic pages.
import { notFound } from "next/navigation";
import { ZIdParams } from "@/shared/api";
import { getCharacteristic } from "@/src/characteristics/setup";
import { prisma } from "@/src/db/client";
import { isAppError } from "@/src/errors";

export async function findCharacteristic(params: Promise<{ id: string }>) {
  const parsed = ZIdParams.safeParse(await params);
  if (!parsed.success) notFound();
  try {
    return await getCharacteristic(prisma, parsed.data.id);
  } catch (error) {
    if (isAppError(error) && error.code === "not-found") notFound();
    throw error;
  }
}
