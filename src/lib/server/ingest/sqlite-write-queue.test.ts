import type { Sequelize } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { queueSqliteWrite } from './sqlite-write-queue';

const dialect = (name: string) => ({ getDialect: () => name }) as unknown as Sequelize;
const tick = () => new Promise((resolve) => setTimeout(resolve, 5));

/** Queues three writes that each record when they start and end; the second one fails. */
async function runThree(sequelize: Sequelize): Promise<{ events: string[]; outcomes: PromiseSettledResult<string>[] }> {
  const events: string[] = [];
  const write = (name: string, fails = false) =>
    queueSqliteWrite(sequelize, async () => {
      events.push(`${name} start`);
      await tick();
      events.push(`${name} end`);
      if (fails) throw new Error(`${name} failed`);
      return name;
    });
  const outcomes = await Promise.allSettled([write('a'), write('b', true), write('c')]);
  return { events, outcomes };
}

describe('queueSqliteWrite', () => {
  it('runs SQLite writes one after another, in order, past a failing one', async () => {
    const { events, outcomes } = await runThree(dialect('sqlite'));
    expect(events).toEqual(['a start', 'a end', 'b start', 'b end', 'c start', 'c end']);
    expect(outcomes.map((outcome) => outcome.status)).toEqual(['fulfilled', 'rejected', 'fulfilled']);
    expect((outcomes[1] as PromiseRejectedResult).reason).toEqual(new Error('b failed'));
  });

  it('runs PostgreSQL writes at once, leaving concurrency to the server', async () => {
    const { events } = await runThree(dialect('postgres'));
    expect(events.slice(0, 3)).toEqual(['a start', 'b start', 'c start']);
  });
});
