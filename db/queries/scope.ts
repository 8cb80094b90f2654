import "server-only";
import { and, isNull, sql as dsql, type SQL } from "drizzle-orm";
import { captures, customerMembers, sites } from "@/db/schema";
import { readScope, type Reader } from "@/lib/auth/permissions";

// SQL forms of the object-level read rules decided in lib/auth/permissions.ts (readScope).

/** Sites `reader` may see: all, or those owned by a customer the viewer belongs to. */
export function sitesVisibleTo(reader: Reader): SQL | undefined {
  const scope = readScope(reader);
  if (scope.kind === "all") return undefined;
  return dsql`${sites.customerId} in (select ${customerMembers.customerId} from ${customerMembers} where ${customerMembers.userId} = ${scope.userId})`;
}

/**
 * Captures `reader` may see: every capture not withdrawn, or, for a viewer, those of the viewer's
 * customers' sites that carry an approved evaluation (a newer result awaiting review does not hide it).
 */
export function capturesVisibleTo(reader: Reader): SQL | undefined {
  const scope = readScope(reader);
  if (scope.kind === "all") return isNull(captures.withdrawnAt);
  return and(
    isNull(captures.withdrawnAt),
    scope.approvedOnly ? dsql`${captures.approvedEvaluationId} is not null` : undefined,
    dsql`${captures.siteId} in (select ${sites.id} from ${sites} where ${sitesVisibleTo(reader)})`,
  );
}
