import { describe, expect, it } from 'vitest';
import pino from 'pino';
import { TeamEvents, type TeamEvent } from '../../../server/events/team-events';

describe('TeamEvents', () => {
  const event = { type: 'channel.moved' as const, teamId: 't1', actorId: 'u1', subject: { kind: 'channel' as const, label: 'shipping' }, data: { from: 1, to: 2 } };

  it('tells every subscriber, stamping the time', async () => {
    const seen: TeamEvent[][] = [[], []];
    const bus = new TeamEvents(pino({ level: 'silent' }));
    bus.subscribe('a', (e) => { seen[0]!.push(e); });
    bus.subscribe('b', async (e) => { seen[1]!.push(e); });
    await bus.publish(event);
    expect(seen[0]).toHaveLength(1);
    expect(seen[1]![0]!.data).toEqual({ from: 1, to: 2 });
    expect(seen[0]![0]!.at).toBeInstanceOf(Date);
  });

  it('a failing subscriber is logged and neither fails the publisher nor stops the others', async () => {
    const logged: string[] = [];
    const logger = pino({ level: 'error' }, { write: (line: string) => { logged.push(line); } });
    const bus = new TeamEvents(logger);
    let delivered = 0;
    bus.subscribe('broken', () => { throw new Error('receiver down'); });
    bus.subscribe('fine', () => { delivered++; });
    await expect(bus.publish(event)).resolves.toBeUndefined();
    expect(delivered).toBe(1);
    expect(logged.join('')).toContain('receiver down');
    expect(logged.join('')).toContain('broken');
  });
});
