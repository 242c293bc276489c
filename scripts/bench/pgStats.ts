/**
 * What the bench reads back from its PostgreSQL: how the group writer grouped the single-reading
 * requests, and (with --pg-stats) pg_stat_statements' top statements for the profile.
 */
import fs from 'node:fs';

import pg from 'pg';

/** Groups of this many rows (upper bounds of the buckets), the last open-ended. */
const GROUP_BUCKETS = [1, 2, 4, 8, 16, 32] as const;

export interface GroupSizes {
  /** Statements (transactions) that inserted readings, and the rows they carried. */
  groups: number;
  rows: number;
  meanRows: number;
  p50Rows: number;
  p90Rows: number;
  maxRows: number;
  /** `≤1`, `≤2`, `≤4`, … `>32`: how many groups fell in each bucket. */
  buckets: Record<string, number>;
}

/**
 * The group size distribution of everything stored so far. Every row one transaction inserts
 * carries that transaction's id in `xmin`, and the writer commits each group in one statement
 * of its own, so counting rows per `xmin` counts rows per group without instrumenting the
 * server.
 */
export async function readGroupSizes(databaseUrl: string): Promise<GroupSizes> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    const { rows } = await client.query<{ n: number; groups: number }>(
      `select n, count(*)::int as groups
         from (select count(*)::int as n from readings group by xmin::text) g
        group by n order by n`,
    );
    const sizes: number[] = [];
    for (const r of rows) for (let i = 0; i < r.groups; i++) sizes.push(r.n);
    const total = sizes.reduce((a, b) => a + b, 0);
    const at = (p: number) => sizes[Math.min(sizes.length - 1, Math.floor(p * sizes.length))] ?? 0;
    const buckets: Record<string, number> = {};
    for (const b of GROUP_BUCKETS) buckets[`≤${b}`] = 0;
    buckets[`>${GROUP_BUCKETS.at(-1)}`] = 0;
    for (const n of sizes) {
      const b = GROUP_BUCKETS.find((limit) => n <= limit);
      buckets[b === undefined ? `>${GROUP_BUCKETS.at(-1)}` : `≤${b}`]! += 1;
    }
    return {
      groups: sizes.length,
      rows: total,
      meanRows: sizes.length ? total / sizes.length : 0,
      p50Rows: at(0.5),
      p90Rows: at(0.9),
      maxRows: sizes.at(-1) ?? 0,
      buckets,
    };
  } finally {
    await client.end();
  }
}

/** pg_stat_statements must be preloaded: the bench's PostgreSQL is started with this. */
export const PG_STATS_SERVER_OPTS =
  '-c shared_preload_libraries=pg_stat_statements -c pg_stat_statements.track=all';

export async function resetPgStats(databaseUrl: string): Promise<void> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    await client.query('create extension if not exists pg_stat_statements');
    await client.query('select pg_stat_statements_reset()');
  } finally {
    await client.end();
  }
}

/** The top statements by total execution time, as a Markdown table, into `file`. */
export async function writePgStats(databaseUrl: string, file: string, top = 12): Promise<void> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    const { rows } = await client.query<{
      pct: string;
      calls: string;
      mean_ms: string;
      rows: string;
      query: string;
    }>(
      `select round((100 * total_exec_time / sum(total_exec_time) over ())::numeric, 1) as pct,
              calls, round(mean_exec_time::numeric, 3) as mean_ms, rows,
              regexp_replace(query, '\\s+', ' ', 'g') as query
         from pg_stat_statements
        order by total_exec_time desc limit $1`,
      [top],
    );
    const lines = [
      '| time % | calls | mean ms | rows | statement |',
      '| ---: | ---: | ---: | ---: | --- |',
      ...rows.map(
        (r) =>
          `| ${r.pct} | ${r.calls} | ${r.mean_ms} | ${r.rows} | \`${r.query.slice(0, 140).replace(/\|/g, '\\|')}\` |`,
      ),
    ];
    lines.push('', ...(await workPerReading(client)));
    fs.writeFileSync(file, `${lines.join('\n')}\n`);
  } finally {
    await client.end();
  }
}

/**
 * Statements per part of the server, counted (so independent of the machine's load), per
 * 1,000 readings stored. Parts are told apart by the statement's text: the alarm engine's
 * statements name its tables (the zone states, alarms, events), read the trend's margins or
 * queue an alarm's mail; BEGIN/COMMIT/ROLLBACK are shown apart (the group writer sends none, so
 * nearly all are the engine's transactions).
 */
async function workPerReading(client: pg.Client): Promise<string[]> {
  const { rows } = await client.query<{ part: string; calls: string; rows: string; ms: string }>(
    `select case
              when query ~* '^\\s*insert into readings \\(.*\\) values \\(\\$1' then 'raw INSERT baseline'
              when query ~* '^\\s*(begin|commit|rollback|savepoint|release)' then 'begin/commit'
              when query ~* 'alarm_zone_states|alarm_events|\\malarms\\M|margin_k is not null|insert into pgboss\\.job|^\\s*select pg_notify'
                then 'alarm engine'
              else 'everything else'
            end as part,
            sum(calls) as calls, sum(rows) as rows, round(sum(total_exec_time)::numeric, 1) as ms
       from pg_stat_statements
      group by 1 order by 1`,
  );
  const stored = await client.query<{ n: string }>('select count(*) as n from readings');
  // A zone judged is a row the zone-state lock returned (the engine's batches lock many at once).
  const judged = await client.query<{ n: string | null }>(
    `select sum(rows) as n from pg_stat_statements
      where query ~* 'alarm_zone_states.*for update'`,
  );
  const zones = Number(judged.rows[0]?.n ?? 0);
  // The raw baseline writes the same table without the server; its rows are not the server's.
  const raw = rows.find((r) => r.part === 'raw INSERT baseline');
  const n = Number(stored.rows[0]!.n) - Number(raw?.rows ?? 0);
  const per = (v: string) => (n > 0 ? ((1000 * Number(v)) / n).toFixed(2) : '–');
  // How often a zone is judged depends on how many readings gather meanwhile (load): per zone
  // judged is the figure of the engine's own cost.
  const perZone = (v: string) => (zones > 0 ? (Number(v) / zones).toFixed(2) : '–');
  return [
    `Readings the server stored in the measured phases: ${n}; zones judged: ${zones}.`,
    '',
    '| part | statements | per 1,000 readings | per zone judged | PG ms | PG ms / 1,000 readings | PG ms / zone judged |',
    '| --- | ---: | ---: | ---: | ---: | ---: | ---: |',
    ...rows
      .filter((r) => r !== raw)
      .map(
        (r) =>
          `| ${r.part} | ${r.calls} | ${per(r.calls)} | ${perZone(r.calls)} | ${r.ms} | ${per(r.ms)} | ${perZone(r.ms)} |`,
      ),
  ];
}
