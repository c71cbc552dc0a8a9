/**
 * `COPY (...) TO STDOUT` through a `pg` client, without another package: a Submittable that
 * counts the CopyData bytes PostgreSQL sends (pg hands CopyData messages to the active query).
 */
import type pg from 'pg';

export function copyOut(client: pg.Client, sql: string): Promise<{ bytes: number; lines: number }> {
  return new Promise((resolve, reject) => {
    let bytes = 0;
    let lines = 0;
    let failure: Error | null = null;
    const submittable = {
      submit(connection: { query: (text: string) => void }) {
        connection.query(sql);
      },
      handleCopyData(msg: { chunk: Buffer }) {
        bytes += msg.chunk.length;
        for (let i = msg.chunk.indexOf(10); i !== -1; i = msg.chunk.indexOf(10, i + 1)) lines++;
      },
      handleCopyInResponse() {
        failure = new Error('COPY FROM is not what this is for.');
      },
      handleRowDescription() {},
      handleDataRow() {},
      handleCommandComplete() {},
      handleEmptyQuery() {},
      handlePortalSuspended() {},
      handleError(err: Error) {
        failure = err;
      },
      handleReadyForQuery() {
        if (failure) reject(failure);
        else resolve({ bytes, lines });
      },
    };
    client.query(submittable as unknown as pg.Submittable);
  });
}
