/** Preview entry: the add-in in a plain browser over an in-memory workbook with demo data. */
import { BARLEY_TRIAL } from "./demo-data";
import { encodeGroups } from "../src/groups";
import { permutationF } from "../src/oneway";

const app = document.getElementById("app")!;
const rows = BARLEY_TRIAL.slice(1);
const values = rows.map((r) => Number(r[3]));
const g = encodeGroups(rows.map((r) => r[1]));
const r = permutationF(values, g.codes, g.names.length, { resamples: 9999, seed: 1 });
app.innerHTML = `<h1>Reshuffle preview</h1><p id="result">RS.GROUPTEST = <span id="p">${r.p.toFixed(4)}</span></p>`;
