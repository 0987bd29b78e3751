/**
 * Stage 1 of an equilibrium: the reaction set (the request's reaction, or equilibrium.reactions),
 * its species in order (reacting, then inert feed species), the stoichiometry, the feed in one
 * unit of amount, the pressure and the key species — every check of the equilibrium's input.
 */
import { EngineRefusal, refuse } from "./errors";
import { checkIndependent, interiorStart } from "./equilibrium-solver";
import type { EquilibriumInput, SetSpecies } from "./equilibrium";
import { feedAmounts } from "./feed";
import { fmt } from "./format";
import { checkBalance, parseReaction, parseSpeciesKey } from "./formula";
import { parseUncertainty } from "./uncertainty";
import { parsePressureBar } from "./units";

export interface ReactionSet {
  texts: string[];
  list: SetSpecies[];
  /** nu[j][i]: coefficient of species i in reaction j. */
  nu: number[][];
  n0: Float64Array;
  conv: ReturnType<typeof feedAmounts>;
  pressureBar: number;
  key: string;
  /** Index of the key species in `list`. */
  k: number;
}

const has = (o: object, k: string) => Object.prototype.hasOwnProperty.call(o, k);

/** Refuses dependent reaction sets, empty feeds, unknown keys, unreachable species and non-positive pressures with exact messages. */
export function reactionSet(input: EquilibriumInput): ReactionSet {
  const eq = input.equilibrium;
  const set = eq.reactions !== undefined;
  const field = set ? "equilibrium.reactions" : "reaction";
  const texts = eq.reactions ?? [input.reaction];
  const parsed = texts.map((text, j) => {
    const r = parseReaction(text);
    for (const t of r.terms) {
      if (!has(input.species, t.key)) {
        refuse("missing-species", `species "${t.key}" is used in ${set ? `${field}[${j}]` : "the reaction"} but has no entry in species`, { species: t.key });
      }
    }
    try {
      checkBalance(r.terms);
    } catch (e) {
      if (e instanceof EngineRefusal && set) refuse(e.code, `${field}[${j}]: ${e.message}`, e.details);
      throw e;
    }
    return r;
  });

  // Species: those of the reactions in order of appearance, then inert feed species.
  const list: SetSpecies[] = [];
  const index = new Map<string, number>();
  for (const r of parsed) {
    for (const t of r.terms) {
      if (index.has(t.key)) continue;
      index.set(t.key, list.length);
      list.push({ key: t.key, reacting: true, phase: t.phase, u: parseUncertainty(t.key, input.species[t.key]) });
    }
  }
  const formulaOf = (key: string) => parseSpeciesKey(key).formula;
  for (const key of Object.keys(eq.feed)) {
    if (index.has(key)) continue;
    const twin = list.find((s) => formulaOf(s.key) === formulaOf(key));
    if (twin) {
      refuse("feed-key-mismatch", `equilibrium.feed: "${key}" is not a species of the reactions (did you mean "${twin.key}"?); a feed key must match the reaction's key exactly`, {
        key,
        suggestion: twin.key,
      });
    }
    index.set(key, list.length);
    list.push({ key, reacting: false, phase: parseSpeciesKey(key).phase, u: null });
  }
  const S = list.length;
  const nu = parsed.map((r) => {
    const row = new Array(S).fill(0);
    for (const t of r.terms) row[index.get(t.key)!] = t.nu;
    return row;
  });
  if (set && nu.length > 1) checkIndependent(nu, texts, field);

  const conv = feedAmounts(eq.feed, eq.feedUnit);
  const n0 = new Float64Array(S);
  for (const [key, v] of Object.entries(conv.amounts)) n0[index.get(key)!] = v;
  if (!n0.some((v) => v > 0)) {
    refuse("empty-feed", "equilibrium.feed: every amount is 0; give at least one species a positive amount");
  }
  const pressureBar = eq.pressureBar === undefined ? 1 : parsePressureBar(eq.pressureBar, "equilibrium.pressureBar");
  if (!(pressureBar > 0)) {
    refuse("nonpositive-pressure", `equilibrium.pressureBar: the pressure must be above 0 bar (got ${fmt(pressureBar)} bar)`);
  }
  let key = eq.key;
  if (key !== undefined) {
    if (!index.has(key)) {
      refuse("invalid-key", `equilibrium.key: "${key}" is neither in the feed nor in the reactions`, { key });
    }
    if (!(n0[index.get(key)!] > 0)) {
      refuse("invalid-key", `equilibrium.key: "${key}" has no amount in the feed, so its conversion is undefined`, { key });
    }
  } else {
    const first = parsed[0].terms.find((t) => t.nu < 0 && n0[index.get(t.key)!] > 0);
    key = first?.key ?? list.find((s, i) => n0[i] > 0)!.key;
  }
  const k = index.get(key)!;

  if (nu.length > 1) {
    // A species marked condensed may stay absent (a phase that does not form); a gas may not.
    const condensed = (i: number) => list[i].phase !== undefined && list[i].phase !== "g";
    const probe = interiorStart({ n0, nu, gas: list.map((_, i) => !condensed(i)), g: new Float64Array(S), lnP: 0 }, condensed);
    if (probe.absent.length > 0) {
      const names = probe.absent.map((i) => `"${list[i].key}"`).join(", ");
      refuse(
        "unreachable-species",
        `equilibrium.feed: the reactions cannot form ${names} from this feed, so the set has no solution with every species present; add ${probe.absent.length > 1 ? "them" : "it"} to the feed or drop the reactions that need ${probe.absent.length > 1 ? "them" : "it"}`,
        { species: probe.absent.map((i) => list[i].key) },
      );
    }
  }

  return { texts, list, nu, n0, conv, pressureBar, key, k };
}
