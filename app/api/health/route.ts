import { NextResponse } from "next/server";
import { db } from "@/db";
import { checkHealth } from "@/lib/server/check-health";

export const dynamic = "force-dynamic";

export async function GET() {
  const health = await checkHealth(db);
  return NextResponse.json(health, {
    status: health.status === "ok" ? 200 : 503,
    headers: { "Cache-Control": "no-store" },
  });
}
