/**
 * `npm run bench`: figures measured side by side in one run, printed as one table.
 * Gang sheet packing and upload analysis; each measurement lives in scripts/bench/, this file
 * runs them in order and prints the table.
 */
import os from "node:os";
import { measureGangSheets } from "./bench/gang-sheet";
import { printTable, type Row } from "./bench/table";
import { measureUploadAnalysis } from "./bench/upload-analysis";

const rows: Row[] = [];
rows.push(...measureGangSheets());
rows.push(...(await measureUploadAnalysis()));
printTable(rows, `Chalkline benchmarks on ${os.cpus().length} × ${os.cpus()[0]?.model ?? "cpu"}, ${Math.round(os.totalmem() / 2 ** 30)} GiB, Node ${process.version}`);
