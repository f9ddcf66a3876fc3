import { z } from 'zod';

/**
 * A record's id in a route address. A refusal says which address in people's words ("The revision
 * address is not valid"); the title is the field's label in the 400's `fields`.
 */
export const idIn = (what: string) =>
  z
    .uuid({ error: `The ${what} address is not valid` })
    .meta({ title: `${what.charAt(0).toUpperCase()}${what.slice(1)} address` });
