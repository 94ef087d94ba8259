import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { toTendonCsv } from "@/lib/csv/tendon-schedule";
import { route } from "@/lib/http/route";
import { pourParamsSchema } from "@/lib/schemas/pour";
import { displayUnits } from "@/lib/schemas/project-settings";
import { getProjectSettings } from "@/lib/server/get-project-settings";
import { listTendons } from "@/lib/server/list-tendons";

/** The pour's schedule in the import layout, in the project's units. */
export const GET = route(
  { params: pourParamsSchema, access: ({ params }) => authorize("schedule.view", params.projectId) },
  async ({ params }) => {
    const [project, { pour, tendons }] = await Promise.all([
      getProjectSettings(db, params.projectId),
      listTendons(db, params),
    ]);
    const csv = toTendonCsv(tendons, displayUnits(project).system);
    const name = `${project.code}-${pour.name}`.replace(/[^A-Za-z0-9._-]+/g, "-");
    return new Response(csv, {
      headers: {
        "Content-Type": "text/csv; charset=utf-8",
        "Content-Disposition": `attachment; filename="${name}-tendons.csv"`,
        "Cache-Control": "no-store",
      },
    });
  },
);
