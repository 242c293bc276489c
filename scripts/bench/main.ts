// npm run bench: ingest throughput and live latency against same-run baselines (scripts/bench/).
import { formatReport, readBenchOptions, runBench, USAGE } from '@/scripts/bench';

async function main() {
  const options = readBenchOptions(process.argv.slice(2));
  if (options === 'help') return console.log(USAGE);
  const result = await runBench(options, (line) => console.error(`bench: ${line}`));
  console.log(formatReport(result));
}

main().then(
  () => process.exit(0),
  (err: unknown) => {
    console.error(err);
    process.exit(1);
  },
);
