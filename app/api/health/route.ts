import { NextResponse } from "next/server";
import { databaseReachable } from "@/lib/server/reads/database-health";

export const dynamic = "force-dynamic";

/** Liveness and database reachability, for scripts and the test harness. */
export async function GET() {
  if (await databaseReachable()) return NextResponse.json({ status: "ok", database: "ok" });
  return NextResponse.json({ status: "degraded", database: "unreachable" }, { status: 503 });
}
