// Setting up a new characteristic.
import Link from "next/link";
import { connection } from "next/server";
import { prisma } from "@/src/db/client";
import { SetupForm } from "../setup-form";
import { createFromForm } from "./actions";
import "../characteristics.css";

export default async function NewCharacteristicPage() {
  await connection();
  const processes = await prisma.process.findMany({ select: { id: true, name: true }, orderBy: { name: "asc" } });
  return (
    <>
      <p className="breadcrumb">
        <Link href="/">Characteristics</Link>
      </p>
      <h1>New characteristic</h1>
      {processes.length === 0 ? (
        <p>No process is recorded yet; a characteristic belongs to a process.</p>
      ) : (
        <>
          <p>After saving, set its first control limits from a baseline of subgroups on its settings page.</p>
          <SetupForm action={createFromForm} processes={processes} values={{}} submitLabel="Create characteristic" />
        </>
      )}
    </>
  );
}
