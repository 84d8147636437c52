import { requireActor } from "@/features/access/server/permissions";
import { getTestFile } from "@/features/athlete-tests/server/tests";
import { parseParams, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

export const GET = route<RouteContext<"/api/tests/[id]/file">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const file = await getTestFile(actor, id);
  const safeName = file.filename.replace(/[^A-Za-z0-9._-]/g, "_");
  return new Response(new Uint8Array(file.data), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${safeName}"`,
      "x-content-type-options": "nosniff",
    },
  });
});
