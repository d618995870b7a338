import type { RoundResult } from '../core/device-store/sync-engine';

const changes = (count: number) => `${count} ${count === 1 ? 'change' : 'changes'}`;

/** What one "Sync now" did, in words. */
export function roundWords(result: RoundResult): string {
  if (result.skipped) return 'Another Rimelog tab on this device is syncing right now; this screen follows when it is done.';
  if (!result.ok) return `Not synced. ${result.error ?? ''}`.trim();
  const pushed = result.pushed;
  const sent = pushed.applied + pushed.duplicate + pushed.conflict + pushed.rejected;
  const parts = [`Synced: ${changes(sent)} sent, ${changes(result.pulledChanges)} received`];
  if (pushed.conflict > 0) parts.push(`${pushed.conflict} clashed with another device and are kept as conflicts`);
  if (pushed.rejected > 0) parts.push(`${pushed.rejected} refused (see below)`);
  const waiting = pushed.deferred + pushed.unanswered;
  if (waiting > 0) parts.push(`${changes(waiting)} still waiting`);
  return `${parts.join('; ')}.`;
}
