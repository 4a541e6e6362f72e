import { describe, expect, it } from 'vitest';
import { storageCodeOf, storageFailureOf } from './storage-error';

const withCode = (code: string) => Object.assign(new Error(`failed with ${code}`), { code });

describe('storageFailureOf', () => {
  it.each([
    { what: 'a full disk (errno ENOSPC)', error: withCode('ENOSPC'), status: 507, code: 'storage.full' },
    { what: 'a quota (errno EDQUOT)', error: withCode('EDQUOT'), status: 507, code: 'storage.full' },
    { what: 'a read-only mount (errno EROFS)', error: withCode('EROFS'), status: 503, code: 'storage.read-only' },
    { what: 'no permission (errno EACCES)', error: withCode('EACCES'), status: 503, code: 'storage.read-only' },
    {
      what: 'a full database, as Sequelize wraps it (SQLITE_FULL in parent)',
      error: Object.assign(new Error('Validation'), { parent: withCode('SQLITE_FULL') }),
      status: 507,
      code: 'storage.full'
    },
    {
      what: 'a read-only database, as Sequelize wraps it (SQLITE_READONLY in original)',
      error: Object.assign(new Error('Database'), { original: withCode('SQLITE_READONLY') }),
      status: 503,
      code: 'storage.read-only'
    },
    {
      what: 'a wrapped cause two levels down',
      error: new Error('outer', { cause: new Error('middle', { cause: withCode('ENOSPC') }) }),
      status: 507,
      code: 'storage.full'
    }
  ])('answers $status $code for $what, saying what to do about DATA_DIR', ({ error, status, code }) => {
    const failure = storageFailureOf(error);
    expect([failure?.status, failure?.code]).toEqual([status, code]);
    expect(failure!.message).toContain('DATA_DIR');
    expect(failure!.message).toContain('not stored');
  });

  it.each([
    { what: 'a missing file', error: withCode('ENOENT') },
    { what: 'a busy database', error: Object.assign(new Error('x'), { parent: withCode('SQLITE_BUSY') }) },
    { what: 'a plain bug', error: new TypeError('undefined is not a function') },
    { what: 'a thrown string', error: 'ENOSPC' },
    { what: 'nothing', error: null }
  ])('leaves $what to the unexpected-error path', ({ error }) => {
    expect(storageFailureOf(error)).toBeNull();
  });

  it('stops on an error whose cause chain loops', () => {
    const looping = new Error('a') as Error & { cause?: unknown };
    looping.cause = looping;
    expect(storageCodeOf(looping)).toBeNull();
  });
});
