import 'server-only';
import { defineOperation } from '@/lib/server/operation';
import { checkIsolation } from '@/lib/server/isolation';
import { recordId } from '@/lib/server/operations/shared';
import { isolationCheckSchema, isolationQuerySchema } from '@/lib/validations/isolation';

// The isolation check (issue 9, section 5): for leads, before publishing.

// GET /api/tree-versions/{id}/isolation-check[?controlSupply=&ignition=&fuel=&draft=&flameTest=]
export const isolationCheckOp = defineOperation({
  name: 'treeVersions.isolationCheck',
  input: isolationQuerySchema.extend({ id: recordId }),
  output: isolationCheckSchema,
  handler: async ({ scope, input }) => {
    const { id, ...query } = input;
    return checkIsolation({ scope, id, query });
  },
});
