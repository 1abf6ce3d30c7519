/**
 * Rule-set judgements on an estimated temperature history: the lines a planner shows under its
 * result. Every limit comes from the rule set (lib/schemas/templates.ts ruleSetSchema); the
 * functions here only compare a modelled curve with it, and say what they assume. They never
 * say food "is safe".
 *
 *  - thawing: raw food may have its surface above the chill limit for `thawSurfaceAboveMax_s`,
 *    ready-to-eat food for `thawReadyToEatAboveMax_s` (0 = never);
 *  - time as a control: `outsideControlMax_s` for hot or cold food, and the longer
 *    `outsideControlColdMax_s` for cold food that starts at or below the chill limit and never
 *    passes `outsideControlColdCeiling_C`;
 *  - tolerance periods: one period above the chill limit (`chillExcursionMax_s`) or below the
 *    hot-holding limit (`hotExcursionMax_s`), once;
 *  - two-stage cooling: `coolFrom_C` → `coolStage1To_C` within `coolStage1Max_s`, then to
 *    `coolStage2To_C` within `coolStage2Max_s`, counted from the start or from the end of stage 1.
 */
import type { RuleSet } from "../schemas/templates";

export interface ComplianceLine {
  rule: string;
  status: "meets" | "exceeds" | "not approved" | "check locally";
  detail: string;
}

const hours = (s: number) => `${(s / 3600).toFixed(1)} h`;
const deg = (T: number) => `${Math.round(T * 10) / 10} °C`;

/** A sampled temperature history: times (s, rising) and the temperature at each. */
export interface Curve {
  t_s: number[];
  T_C: number[];
}

export interface Excursion {
  /** Total time beyond the limit (s), linear between samples. */
  total_s: number;
  /** Number of separate periods beyond the limit. */
  periods: number;
  /** The longest single period (s). */
  longest_s: number;
  /** When the curve first passes the limit (s), or null. */
  first_s: number | null;
  /** The furthest temperature beyond the limit (highest for "above", lowest for "below"). */
  extreme_C: number;
}

/** Time a sampled curve spends above (or below) a limit up to `tEnd_s`, with its separate periods. */
export function excursion(c: Curve, limit_C: number, side: "above" | "below", tEnd_s: number): Excursion {
  const sgn = side === "above" ? 1 : -1;
  const d = (T: number) => sgn * (T - limit_C);
  let total = 0;
  let periods = 0;
  let longest = 0;
  let current = 0;
  let first: number | null = null;
  let extreme = c.T_C.length ? c.T_C[0] : limit_C;
  let open = false;
  const close = () => {
    total += current;
    longest = Math.max(longest, current);
    current = 0;
    open = false;
  };
  if (c.t_s.length && c.t_s[0] <= tEnd_s && d(c.T_C[0]) > 0) {
    open = true;
    periods = 1;
    first = c.t_s[0];
  }
  for (let i = 1; i < c.t_s.length && c.t_s[i - 1] < tEnd_s; i++) {
    const t0 = c.t_s[i - 1];
    const t1 = Math.min(c.t_s[i], tEnd_s);
    const frac = c.t_s[i] > t0 ? (t1 - t0) / (c.t_s[i] - t0) : 1;
    const T1 = c.T_C[i - 1] + (c.T_C[i] - c.T_C[i - 1]) * frac; // at t1 (the step may be cut at tEnd_s)
    if (sgn * (T1 - extreme) > 0) extreme = T1;
    const a = d(c.T_C[i - 1]);
    const b = d(T1);
    if (a > 0 && b > 0) current += t1 - t0;
    else if (a > 0) {
      current += (a / (a - b)) * (t1 - t0); // leaves the limit inside the step
      close();
    } else if (b > 0) {
      const tc = t0 + (a / (a - b)) * (t1 - t0); // passes the limit inside the step
      if (first === null) first = tc;
      periods++;
      open = true;
      current = t1 - tc;
    }
  }
  if (open) close();
  return { total_s: total, periods, longest_s: longest, first_s: first, extreme_C: extreme };
}

/** First time a curve reaches `target_C` going down (`falling`) or up, linear between samples; null if not within the curve. */
export function reaches(c: Curve, target_C: number, falling: boolean, from_s = 0): number | null {
  const past = (T: number) => (falling ? T <= target_C : T >= target_C);
  for (let i = 0; i < c.t_s.length; i++) {
    if (c.t_s[i] < from_s) continue;
    if (past(c.T_C[i])) {
      if (i === 0 || c.t_s[i - 1] < from_s || c.T_C[i] === c.T_C[i - 1]) return c.t_s[i];
      const f = (target_C - c.T_C[i - 1]) / (c.T_C[i] - c.T_C[i - 1]);
      return c.t_s[i - 1] + Math.min(1, Math.max(0, f)) * (c.t_s[i] - c.t_s[i - 1]);
    }
  }
  return null;
}

// ---------------------------------------------------------------- thawing

/**
 * The thawing line for time above the chill limit. Ready-to-eat food is judged against
 * `thawReadyToEatAboveMax_s` (FDA Food Code 2022 §3-501.13(B)(3): not above 5 °C at all), raw food
 * against `thawSurfaceAboveMax_s` (§3-501.13(B)(4): at most 4 h). The tolerance periods of a rule
 * set are for food for service or on display, not for thawing, so they are not used here.
 */
export function thawTimeAboveLine(rs: RuleSet, readyToEat: boolean, above_s: number, chill_C: number): ComplianceLine {
  const kind = readyToEat ? "Ready-to-eat food" : "Raw food";
  const lim = readyToEat ? rs.thawReadyToEatAboveMax_s : rs.thawSurfaceAboveMax_s;
  const est = `Estimated ${hours(above_s)} with the surface above ${deg(chill_C)} before the centre is thawed`;
  if (lim === null) {
    return { rule: `${kind}: time above ${deg(chill_C)} while thawing`, status: "check locally", detail: `${est}; "${rs.name}" sets no limit for ${readyToEat ? "ready-to-eat" : "raw"} food` };
  }
  // A tolerance of one second absorbs the interpolation of a surface that only touches the limit.
  const meets = above_s <= lim + 1;
  if (lim === 0) {
    return {
      rule: `${kind}: surface not above ${deg(chill_C)} at any time while thawing`,
      status: meets ? "meets" : "exceeds",
      detail: meets ? `The surface stays at or below ${deg(chill_C)} in this model` : `${est}: ready-to-eat food may not rise above the chill limit`,
    };
  }
  return {
    rule: `${kind}: surface above ${deg(chill_C)} for at most ${hours(lim)} while thawing`,
    status: meets ? "meets" : "exceeds",
    detail: `${est}${readyToEat ? "" : "; the allowance also covers preparation before cooking"}`,
  };
}

// ---------------------------------------------------------------- time as a control, tolerance periods

/**
 * Lines for one product of a hold plan that leaves its band: how long it was out of its limit on
 * the route, against the rule set's time as a control (hot or cold, and the cold-food variant with
 * its ceiling) and tolerance periods. The clock starts when the warmest point (the coldest for hot
 * food) first passes the limit and runs to the end of the route: the food is taken to be out of
 * temperature control from then on, even if it comes back.
 */
export function outOfBandLines(
  rs: RuleSet,
  name: string,
  mode: "chilled" | "hot",
  start_C: number,
  curve: Curve,
  routeEnd_s: number,
  earliest_s: number | null = null,
): ComplianceLine[] {
  const chilled = mode === "chilled";
  const limit_C = chilled ? rs.chilledMax_C : rs.hotHoldMin_C;
  const ex = excursion(curve, limit_C, chilled ? "above" : "below", routeEnd_s);
  if (ex.first_s === null) return [];
  const out: ComplianceLine[] = [];
  const span = routeEnd_s - ex.first_s;
  const where = chilled ? `above ${deg(limit_C)}` : `below ${deg(limit_C)}`;
  const sooner = earliest_s !== null && earliest_s < ex.first_s - 60 ? `; at the low end of the uncertainty band the load leaves its band at ${hours(earliest_s)}, which leaves more time out of control` : "";
  const said = `Central estimate: ${where} from ${hours(ex.first_s)} into the route, ${hours(span)} to its end (${hours(ex.total_s)} ${where} in all, ${ex.periods === 1 ? "one period" : `${ex.periods} periods`}; ${chilled ? "warmest" : "coldest"} point ${deg(ex.extreme_C)})${sooner}`;
  if (rs.outsideControlMax_s !== null) {
    out.push({
      rule: `${name}: time as a control, at most ${hours(rs.outsideControlMax_s)} out of temperature control`,
      status: span <= rs.outsideControlMax_s ? "meets" : "exceeds",
      detail: `${said}. Only if the food is marked and then cooked, served or discarded within the allowance`,
    });
  }
  if (chilled && rs.outsideControlColdMax_s !== null && rs.outsideControlColdCeiling_C !== null) {
    const ceiling = rs.outsideControlColdCeiling_C;
    const startsCold = start_C <= rs.chilledMax_C;
    const staysBelow = ex.extreme_C <= ceiling;
    out.push({
      rule: `${name}: cold food, at most ${hours(rs.outsideControlColdMax_s)} out of temperature control if it starts at or below ${deg(rs.chilledMax_C)} and never passes ${deg(ceiling)}`,
      status: startsCold && staysBelow && span <= rs.outsideControlColdMax_s ? "meets" : "exceeds",
      detail: !startsCold
        ? `Packed at ${deg(start_C)}, above ${deg(rs.chilledMax_C)}: this allowance does not apply`
        : !staysBelow
          ? `${said}. It passes ${deg(ceiling)}, so this allowance does not apply: discard it`
          : `${said}. Only if the food is marked and then served or discarded within the allowance`,
    });
  }
  const tol = chilled ? rs.chillExcursionMax_s : rs.hotExcursionMax_s;
  if (tol !== null) {
    const once = ex.periods <= 1;
    out.push({
      rule: `${name}: tolerance period, one period of at most ${hours(tol)} ${where}, once`,
      status: once && ex.longest_s <= tol ? "meets" : "exceeds",
      detail: `${said}. Applies only to food for service or on display, which has not used its tolerance before${once ? "" : "; only one period is allowed"}`,
    });
  }
  if (!out.length) {
    out.push({ rule: `${name}: time ${where}`, status: "check locally", detail: `${said}. "${rs.name}" sets no time allowance ${where}` });
  }
  return out;
}

// ---------------------------------------------------------------- two-stage cooling

/** Whether the rule set has a two-stage cooling limit (all five values). */
export function hasCoolingStages(rs: RuleSet): boolean {
  return rs.coolFrom_C !== null && rs.coolStage1To_C !== null && rs.coolStage1Max_s !== null && rs.coolStage2To_C !== null && rs.coolStage2Max_s !== null;
}

/** One cooling stage judged on a curve: the times are counted from the stage's own start (`countedFrom_s`). */
export interface CoolingStage {
  stage: 1 | 2;
  /** The temperature the stage's clock starts from: `coolFrom_C`, or for stage 2 counted after stage 1, `coolStage1To_C`. */
  from_C: number;
  to_C: number;
  /** Time allowed, s. */
  limit_s: number;
  /** Time the curve takes from the stage's start to `to_C`, s; null if not within the curve. */
  reached_s: number | null;
  /** Whether it is within the limit; null when the curve is too short to tell or the stage does not apply. */
  meets: boolean | null;
  /** When the stage's clock starts on the curve, s; null if it never starts. */
  countedFrom_s: number | null;
  line: ComplianceLine;
}

/**
 * Judges a cool-down from hot against the rule set's two stages, on the warmest point's curve.
 * The clock starts when the warmest point falls to `coolFrom_C` (at once if it starts below).
 * Stage 1 ends when it reaches `coolStage1To_C`; stage 2 when it reaches `coolStage2To_C`, whose
 * deadline is counted from the start ("in all", FDA Food Code 2022 §3-501.14(A)) or from the end of
 * stage 1 ("a further …", FSANZ Standard 3.2.2 cl. 7(3)). `horizon_s` is how far the curve runs.
 * Returns the stages with their numbers (empty when the rule set has no two-stage limit).
 */
export function coolingStages(rs: RuleSet, warmest: Curve, horizon_s: number): CoolingStage[] {
  if (!hasCoolingStages(rs)) return [];
  const from = rs.coolFrom_C!;
  const to1 = rs.coolStage1To_C!;
  const to2 = rs.coolStage2To_C!;
  const max1 = rs.coolStage1Max_s!;
  const max2 = rs.coolStage2Max_s!;
  const inAll = rs.coolStage2Counted === "in_all";
  const T0 = warmest.T_C[0];
  const r1 = `Cooling stage 1: ${deg(from)} → ${deg(to1)} within ${hours(max1)}`;
  const r2 = `Cooling stage 2: to ${deg(to2)} within ${hours(max2)} ${inAll ? "of the start, in all" : "more after stage 1"}`;
  const s1 = (reached_s: number | null, meets: boolean | null, countedFrom_s: number | null, line: ComplianceLine): CoolingStage => ({ stage: 1, from_C: from, to_C: to1, limit_s: max1, reached_s, meets, countedFrom_s, line });
  const s2 = (reached_s: number | null, meets: boolean | null, countedFrom_s: number | null, line: ComplianceLine): CoolingStage => ({ stage: 2, from_C: inAll ? from : to1, to_C: to2, limit_s: max2, reached_s, meets, countedFrom_s, line });
  if (T0 <= to1) {
    return [s1(null, null, null, { rule: r1, status: "check locally", detail: `Starts at ${deg(T0)}, already at or below ${deg(to1)}: the two-stage limit is for cooked food cooling from hot; check the rule for food cooled from room temperature` })];
  }
  const t0 = T0 > from ? reaches(warmest, from, true) : 0;
  if (t0 === null) {
    return [s1(null, null, null, { rule: r1, status: "check locally", detail: `The warmest point does not fall to ${deg(from)} within the ${hours(horizon_s)} looked at` })];
  }
  const startSaid = t0 > 0 ? `the clock starts when the warmest point falls to ${deg(from)}, ${hours(t0)} in` : `the clock starts at once (it starts at ${deg(T0)})`;
  const out: CoolingStage[] = [];
  const t1 = reaches(warmest, to1, true, t0);
  if (t1 === null) {
    const seen = horizon_s - t0;
    out.push(
      s1(null, seen >= max1 ? false : null, t0, {
        rule: r1,
        status: seen >= max1 ? "exceeds" : "check locally",
        detail: seen >= max1 ? `Not at ${deg(to1)} within ${hours(seen)} (${startSaid})` : `Not at ${deg(to1)} within the ${hours(seen)} looked at: look further ahead (${startSaid})`,
      }),
    );
    return out;
  }
  const d1 = t1 - t0;
  out.push(s1(d1, d1 <= max1, t0, { rule: r1, status: d1 <= max1 ? "meets" : "exceeds", detail: `Estimated ${hours(d1)} to ${deg(to1)} at the warmest point (${startSaid})` }));
  const base = inAll ? t0 : t1;
  const deadline = base + max2;
  const t2 = reaches(warmest, to2, true, t1);
  if (t2 === null) {
    out.push(
      s2(null, horizon_s >= deadline ? false : null, base, {
        rule: r2,
        status: horizon_s >= deadline ? "exceeds" : "check locally",
        detail: horizon_s >= deadline ? `Not at ${deg(to2)} within ${hours(horizon_s - t0)} of the start` : `Not at ${deg(to2)} within the ${hours(horizon_s)} looked at: look further ahead`,
      }),
    );
    return out;
  }
  out.push(
    s2(t2 - base, t2 <= deadline, base, {
      rule: r2,
      status: t2 <= deadline ? "meets" : "exceeds",
      detail: `Estimated ${hours(t2 - t0)} from the start to ${deg(to2)} at the warmest point (${hours(t2 - t1)} after stage 1)`,
    }),
  );
  return out;
}

/** The compliance lines of `coolingStages`. */
export function coolingStageLines(rs: RuleSet, warmest: Curve, horizon_s: number): ComplianceLine[] {
  return coolingStages(rs, warmest, horizon_s).map((s) => s.line);
}

// ---------------------------------------------------------------- the planners' hooks

/** The warmest (or, for hot food, coldest) of centre and surface at each sample. */
function extremeCurve(t_s: number[], centre: number[], surface: number[], warmest: boolean): Curve {
  return { t_s, T_C: t_s.map((_, i) => (warmest ? Math.max(centre[i], surface[i]) : Math.min(centre[i], surface[i]))) };
}

/**
 * Hold planner: for each chilled or hot product that leaves its band on the route, its time out
 * of the band against the rule set's allowances. Frozen products get no line here.
 */
export function holdCompliance(
  rs: RuleSet,
  products: { name: string; start_C: number; mode: "chilled" | "frozen" | "hot" }[],
  series: { t_s: number; products: { center_C: number; surface_C: number }[] }[],
  routeLength_s: number,
  /** The earliest hold time over the uncertainty sample, if any, to say when the band's low end fails sooner. */
  earliest_s: number | null = null,
): ComplianceLine[] {
  const t = series.map((p) => p.t_s);
  const out: ComplianceLine[] = [];
  products.forEach((p, j) => {
    if (p.mode === "frozen") return;
    const chilled = p.mode === "chilled";
    const curve = extremeCurve(t, series.map((s) => s.products[j].center_C), series.map((s) => s.products[j].surface_C), chilled);
    out.push(...outOfBandLines(rs, p.name, p.mode, p.start_C, curve, routeLength_s, earliest_s));
  });
  return out;
}

/**
 * Warm-up / cool-down check: a cool-down from hot (to the hot-holding limit, or any other limit for
 * food that starts above the stage-1 end and cools) is judged against the two cooling stages (on the
 * warmest point); food warming from chilled gets the cold-food time-as-a-control line (does the
 * warmest point stay below the ceiling for the allowance?).
 */
export function warmupCompliance(
  rs: RuleSet,
  direction: "warming" | "cooling",
  limit_C: number,
  start_C: number,
  series: { t_s: number; center_C: number; surface_C: number }[],
  horizon_s: number,
): ComplianceLine[] {
  const t = series.map((p) => p.t_s);
  const out: ComplianceLine[] = [];
  const warmest = extremeCurve(t, series.map((p) => p.center_C), series.map((p) => p.surface_C), true);
  // Food that starts hot and cools is judged against the cooling stages, whichever limit was asked for.
  const cools = warmest.T_C.length > 1 && warmest.T_C[warmest.T_C.length - 1] < warmest.T_C[0];
  if (direction === "cooling" || (cools && rs.coolStage1To_C !== null && start_C > rs.coolStage1To_C)) {
    out.push(...coolingStageLines(rs, warmest, horizon_s));
    return out;
  }
  if (limit_C !== rs.chilledMax_C) return out;
  if (rs.outsideControlColdMax_s !== null && rs.outsideControlColdCeiling_C !== null) {
    const ceiling = rs.outsideControlColdCeiling_C;
    const allow = rs.outsideControlColdMax_s;
    const rule = `Cold food out of temperature control for at most ${hours(allow)}, if it starts at or below ${deg(rs.chilledMax_C)} and never passes ${deg(ceiling)}`;
    if (start_C > rs.chilledMax_C) out.push({ rule, status: "exceeds", detail: `Starts at ${deg(start_C)}, above ${deg(rs.chilledMax_C)}: this allowance does not apply` });
    else {
      const tc = reaches(warmest, ceiling, false);
      if (tc !== null && tc < allow) out.push({ rule, status: "exceeds", detail: `The warmest point passes ${deg(ceiling)} after ${hours(tc)}: under this allowance it must be discarded then` });
      else if (tc === null && horizon_s < allow) out.push({ rule, status: "check locally", detail: `Not past ${deg(ceiling)} within the ${hours(horizon_s)} looked at: look at least ${hours(allow)} ahead` });
      else out.push({ rule, status: "meets", detail: `The warmest point stays at or below ${deg(ceiling)} for ${hours(allow)}; mark the food and serve or discard it by then` });
    }
  }
  return out;
}
