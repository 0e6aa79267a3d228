// Contract of the live updates (/api/builds/:buildId/events, text/event-stream): each "change"
// message's data names what changed; the browser then re-fetches through its role-filtered API.
import { z } from 'zod';

export const BuildChange = z.object({ what: z.array(z.string()) });
export type BuildChange = z.infer<typeof BuildChange>;
