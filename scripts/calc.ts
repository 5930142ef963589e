/**
 * Command-line analysis of a system document.
 *   npm run --silent calc -- <system.json>                 → the analysis as JSON on stdout
 *   npm run --silent calc -- <system.json> --ledger <id>   → that fixture's pressure ledger as a table
 * Bad input: the structured error as JSON on stderr, exit code 1 — through safeAnalyzeSystem, so the
 * command line answers exactly as the server does (an absurd magnitude is `value-out-of-range`).
 * `npm run calc` runs this file from its prebuilt bundle (scripts/calc.mjs → dist-cli/calc.mjs).
 */
import { readFileSync } from 'node:fs';
import { safeAnalyzeSystem, EngineInputError, formatLedger, ledgerFor } from '../src/engine';

function fail(error: unknown): never {
  const json =
    error instanceof EngineInputError
      ? error.toJSON()
      : { name: 'Error', code: 'cannot-read', message: error instanceof Error ? error.message : String(error) };
  process.stderr.write(JSON.stringify(json, null, 2) + '\n');
  process.exit(1);
}

const args = process.argv.slice(2);
const ledgerAt = args.indexOf('--ledger');
const fixtureId = ledgerAt >= 0 ? args[ledgerAt + 1] : undefined;
const file = args.find((a, i) => !a.startsWith('--') && (ledgerAt < 0 || i !== ledgerAt + 1));
if (!file || (ledgerAt >= 0 && !fixtureId)) {
  process.stderr.write('usage: npm run --silent calc -- <system.json> [--ledger <fixtureId>]\n');
  process.exit(2);
}

let doc: unknown;
try {
  doc = JSON.parse(readFileSync(file, 'utf8'));
} catch (e) {
  fail(e);
}
try {
  const result = safeAnalyzeSystem(doc);
  if (!result.ok) fail(result.error);
  const analysis = result.analysis;
  if (fixtureId !== undefined) process.stdout.write(formatLedger(ledgerFor(analysis, fixtureId), analysis) + '\n');
  else process.stdout.write(JSON.stringify(analysis, null, 2) + '\n');
} catch (e) {
  fail(e);
}
