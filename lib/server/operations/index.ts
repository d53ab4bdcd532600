import 'server-only';
import type { OperationName } from '@/lib/policy';
import type { Operation } from '@/lib/server/operation';
import * as attachments from '@/lib/server/operations/attachments';
import * as auth from '@/lib/server/operations/auth';
import * as company from '@/lib/server/operations/company';
import * as diagnoses from '@/lib/server/operations/diagnoses';
import * as field from '@/lib/server/operations/field';
import * as mail from '@/lib/server/operations/mail';
import * as trees from '@/lib/server/operations/trees';
import * as practice from '@/lib/server/operations/practice';
import * as bench from '@/lib/server/operations/bench';
import * as isolation from '@/lib/server/operations/isolation';

/** Every declared operation, by its policy name (tests check it against lib/policy.ts both ways). */
export const OPERATIONS: ReadonlyMap<OperationName, Operation> = new Map(
  (
    [
      ...Object.values(auth),
      ...Object.values(company),
      ...Object.values(field),
      ...Object.values(diagnoses),
      ...Object.values(mail),
      ...Object.values(attachments),
      ...Object.values(trees),
      ...Object.values(practice),
      ...Object.values(bench),
      ...Object.values(isolation),
    ] as Operation[]
  ).map((op) => [op.name, op]),
);
