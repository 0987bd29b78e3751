/**
 * npm run -s evaluate -- request.json
 * Prints the result JSON on stdout (exit 0). An invalid request prints one line on stderr,
 * nothing on stdout, and exits 2. Any other failure exits 1.
 */
import fs from "node:fs";
import { EngineRefusal, evaluate } from "@/lib/thermo";

function refuseAndExit(message: string): never {
  process.stderr.write(`${message.replace(/\s*\n\s*/g, " ")}\n`);
  process.exit(2);
}

const file = process.argv[2];
if (!file || process.argv.length > 3) refuseAndExit("usage: npm run -s evaluate -- request.json");

let text: string;
try {
  text = fs.readFileSync(file, "utf8");
} catch (e) {
  refuseAndExit(`cannot read ${file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
}

let request: unknown;
try {
  // A UTF-8 byte-order mark (as some editors save) is not part of the JSON.
  request = JSON.parse(text!.replace(/^\uFEFF/, ""));
} catch (e) {
  refuseAndExit(`invalid request: ${file} is not valid JSON (${(e as Error).message})`);
}

try {
  const result = evaluate(request);
  process.stdout.write(`${JSON.stringify(result, null, 2)}\n`);
} catch (e) {
  if (e instanceof EngineRefusal) refuseAndExit(`${e.message} (${e.code})`);
  process.stderr.write(`internal error: ${(e as Error).stack ?? String(e)}\n`);
  process.exit(1);
}
