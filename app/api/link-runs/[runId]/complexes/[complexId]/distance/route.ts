import { requireProjectRole } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { distanceOverrideSchema } from '@/lib/schemas/distance-override';
import { setDistanceOverride } from '@/lib/services/analyses';
import { complexIdSchema } from '@/lib/services/complexes';
import { runProject } from '@/lib/services/link-runs';

/** An editor's distance for a complex (null clears it); later analyses use it. */
export const PUT = route<{ runId: string; complexId: string }>(
  async (req, { runId, complexId }) => {
    const { user } = await requireProjectRole(
      await runProject(runId),
      'editor',
      req,
      'override distances',
    );
    const id = complexIdSchema.parse(complexId);
    const input = distanceOverrideSchema.parse(await jsonBody(req));
    return json(await setDistanceOverride(runId, id, user.id, input));
  },
);
