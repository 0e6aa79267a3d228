// How each kind of waiting action goes to the server: through the same typed API modules the
// screens use online. A mark carries the version it was made from, so a change made meanwhile by
// someone else answers 409 instead of being overwritten; each carries its own key, so a resend whose
// first answer the network lost gets that answer back instead of making the change twice.
import { upgradesApi } from '@/api/upgrades';
import { labourApi } from '@/api/labour';
import { mediaApi } from '@/api/media';
import type { QueuedAction } from './store';

export function sendAction(action: QueuedAction, onProgress: (fraction: number) => void): Promise<unknown> {
  switch (action.kind) {
    case 'mark':
      return upgradesApi.update(
        action.buildId,
        action.upgradeId,
        { ...action.change, version: action.version },
        { idempotencyKey: action.key },
      );
    case 'hours':
      return labourApi.create(
        action.buildId,
        { upgradeId: action.upgradeId, hours: action.hours, kind: action.labourKind, workedOn: action.workedOn },
        { idempotencyKey: action.key },
      );
    case 'photo': {
      const file = new File([action.blob], action.fileName, { type: action.blob.type });
      return mediaApi.upload(
        action.buildId,
        file,
        { stage: action.stage, upgradeId: action.upgradeId, episodeId: action.episodeId },
        onProgress,
        { idempotencyKey: action.key },
      ).done;
    }
  }
}
