/**
 * Loads the shared check values (../shared/reference/cases.json): published data sets
 * with values computed independently in two general-purpose reference libraries (see
 * that folder's README and each case's provenance).
 */
import * as fs from "fs";
import * as path from "path";

export interface Expected { name: string; value: any; kind: string; tolerance: any }
export interface Case { id: string; case_no: number; source: string; data: any; expected: Expected[]; [k: string]: any }

const FILE = path.resolve(__dirname, "../../shared/reference/cases.json");

let cache: Case[] | undefined;
export function cases(): Case[] {
  if (!cache) cache = JSON.parse(fs.readFileSync(FILE, "utf8")).cases as Case[];
  return cache;
}
export function getCase(id: string): Case {
  const c = cases().find((x) => x.id === id);
  if (!c) throw new Error(`no reference case ${id}`);
  return c;
}
export function expected(c: Case, name: string): Expected {
  const e = c.expected.find((x) => x.name === name);
  if (!e) throw new Error(`case ${c.id} has no expected value ${name}`);
  return e;
}
export function value(c: Case, name: string): any {
  return expected(c, name).value;
}
