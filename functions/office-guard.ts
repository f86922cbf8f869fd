/**
 * Makes the custom-functions entry loadable outside Excel.
 *
 * The metadata plugin appends `CustomFunctions.associate("ID", fn)` calls to the end of
 * functions.ts. In the webpack bundle a module's imports run before its body, so this
 * module — imported first by functions.ts — runs before those calls. Where Office.js
 * has not defined `CustomFunctions` (the preview page, tests, a failed office.js
 * load), it installs a stand-in whose `associate` only records the pairs; it defines no
 * `Error`, so results stay SheetError values there (see excel-result.ts).
 */
export interface AssociationStandIn {
  associate(idOrMap: string | Record<string, Function>, fn?: Function): void;
  /** The functions associated so far, by id. */
  readonly associations: Map<string, Function>;
  readonly isStandIn: true;
}

const g = globalThis as { CustomFunctions?: unknown };

function makeStandIn(): AssociationStandIn {
  const associations = new Map<string, Function>();
  return {
    isStandIn: true,
    associations,
    associate(idOrMap, fn) {
      if (typeof idOrMap === "string") {
        if (typeof fn === "function") associations.set(idOrMap.toUpperCase(), fn);
      } else if (idOrMap && typeof idOrMap === "object") {
        for (const [id, f] of Object.entries(idOrMap)) if (typeof f === "function") associations.set(id.toUpperCase(), f);
      }
    },
  };
}

if (typeof g.CustomFunctions === "undefined") g.CustomFunctions = makeStandIn();

/** The stand-in, when this page runs without Office.js (else null). */
export function associationStandIn(): AssociationStandIn | null {
  const cf = g.CustomFunctions as Partial<AssociationStandIn> | undefined;
  return cf && cf.isStandIn === true ? (cf as AssociationStandIn) : null;
}
