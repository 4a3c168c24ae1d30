import { StatusWord, type StatusTone } from '../../../components/status-word';
import type { DeliveryDto } from '../../../../shared/schemas/webhooks';

/** A delivery's state in words and colour: delivered (moss), waiting to retry / sending (amber), failed (brick). */
export function DeliveryState({ d }: { d: Pick<DeliveryDto, 'state' | 'attempts'> }) {
  const [tone, word]: [StatusTone, string] =
    d.state === 'delivered' ? ['pass', 'delivered'] : d.state === 'failed' ? ['over', 'failed'] : d.attempts === 0 ? ['neutral', 'queued'] : ['near', 'retrying'];
  return <StatusWord tone={tone}>{word}</StatusWord>;
}
