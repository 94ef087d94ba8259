import { NextResponse } from "next/server";
import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { route } from "@/lib/http/route";
import { pourParamsSchema } from "@/lib/schemas/pour";
import { importScheduleSchema } from "@/lib/schemas/tendon";
import { importTendonSchedule } from "@/lib/server/import-tendon-schedule";

/** Imports a schedule file (its text, as JSON) into the pour: all rows or none. */
export const POST = route(
  {
    params: pourParamsSchema,
    body: importScheduleSchema,
    access: ({ params }) => authorize("schedule.manage", params.projectId),
  },
  async ({ params, body, access }) =>
    NextResponse.json(await importTendonSchedule(db, { ...params, csv: body.csv, by: access.user.id }), {
      status: 201,
    }),
);
