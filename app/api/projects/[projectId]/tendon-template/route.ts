import { db } from "@/db";
import { authorize } from "@/lib/auth/authorize";
import { templateCsv } from "@/lib/csv/tendon-schedule";
import { route } from "@/lib/http/route";
import { projectParamsSchema } from "@/lib/schemas/member";
import { displayUnits } from "@/lib/schemas/project-settings";
import { getProjectSettings } from "@/lib/server/get-project-settings";

/** An empty schedule with two example rows, in the project's units. */
export const GET = route(
  { params: projectParamsSchema, access: ({ params }) => authorize("schedule.view", params.projectId) },
  async ({ params }) => {
    const project = await getProjectSettings(db, params.projectId);
    return new Response(templateCsv(displayUnits(project).system), {
      headers: {
        "Content-Type": "text/csv; charset=utf-8",
        "Content-Disposition": `attachment; filename="tendon-schedule-template.csv"`,
        "Cache-Control": "no-store",
      },
    });
  },
);
