/**
 * Building blocks shared by the API's schema modules (approval, people, work): times, ids, a
 * person, paging of list queries and the page of a list.
 */
import { z } from 'zod';

/** Milliseconds since the Unix epoch (UTC). */
export const millis = z.number().int();
export const id = z.string().min(1).max(100);
export const person = z.object({ id: z.string(), displayName: z.string() });

/** ?limit&offset of every list query. */
export const paging = {
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).default(0),
};
export const pageQuerySchema = z.object(paging);

/** A page of a list: the items, the count of all that match, and the page asked for. */
export const pageOf = <T extends z.ZodType>(item: T) =>
  z.object({ items: z.array(item), total: z.number().int(), limit: z.number().int(), offset: z.number().int() });
