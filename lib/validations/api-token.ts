import { z } from "zod";

export const createApiTokenSchema = z.object({
  name: z.string().trim().min(1, "Name the token, e.g. “field laptop”").max(80, "At most 80 characters"),
});
