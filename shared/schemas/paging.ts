import { z } from 'zod';

/** `?page=&pageSize=` on every list endpoint. Page counts from 1; at most 200 rows a page. */
export const PageQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type PageQuery = z.infer<typeof PageQuerySchema>;
