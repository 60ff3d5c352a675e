import {
  CRUMPLE,
  KD,
  LAUNCH,
  SPLAT,
  THROWN,
  cancel,
  first,
  follow,
  fromStance,
  hit,
  kd,
  root,
  type CharacterData,
} from "./dsl";

/**
 * Framefork's demo scenario: an invented 3D fighting game, "Vesper Circuit",
 * with an invented cast and invented numbers. Nothing here comes from a real
 * game. Edition 1.1 changes some numbers of 1.0 (see `EDITIONS`), so the
 * explorer and edition reviews have a real difference to show.
 */

export const DEMO_GAME = {
  slug: "vesper-circuit",
  name: "Vesper Circuit",
  summary:
    "An invented 3D fighting game used as Framefork's demo: three fighters, stance cancels with auto-guard, and two editions that differ.",
  fps: 60,
  fastest: 10,
  launchAt: 15,
  rangeKind: "number" as const,
  rangeUnit: "m",
};

export type EditionSlug = "1-0" | "1-1";

export const EDITIONS: { slug: EditionSlug; name: string; releasedOn: Date; notes: string }[] = [
  {
    slug: "1-0",
    name: "1.0 Launch",
    releasedOn: new Date("2026-03-02T00:00:00Z"),
    notes: "The launch edition.",
  },
  {
    slug: "1-1",
    name: "1.1 Tide patch",
    releasedOn: new Date("2026-09-14T00:00:00Z"),
    notes:
      "Tarrow's 2,2,3 is safer when cancelled and his low shin is slower to recover; Velka's 4,4 gap closes; Brannoch gets a new Anvil follow-up.",
  },
];

export interface DemoCharacter {
  slug: string;
  name: string;
  summary: string;
  data: (edition: EditionSlug) => CharacterData;
}

/**
 * Tarrow: a close-range striker. Shows a mid/low guess after 1,2, a natural
 * combo (2,2,3), a cancel that turns a punishable ending safe (2,2,3~f) and
 * one that turns minus into plus (3,4~b).
 */
const tarrow: DemoCharacter = {
  slug: "tarrow",
  name: "Tarrow",
  summary:
    "Harbour-town striker: quick strings that split into a mid or a low, and two stances that hide the recovery.",
  data: (ed) => {
    const e11 = ed === "1-1";
    return {
      stances: [
        { key: "drift", name: "Drift", abbreviation: "DRF", notes: "Leaning back-step; highs pass over him on entry." },
        {
          key: "ember",
          name: "Ember Guard",
          abbreviation: "EMB",
          notes: "Low crouching guard with a fast mid and a launcher.",
        },
      ],
      roots: [
        root("1", first(10, hit("Quick Jab", "high", 7, [1, 8, 8], { range: 1.2, tags: ["poke"] })), [
          follow(",2", { gap: 0, combo: true }, hit("Jab Cross", "high", 9, [-3, 5, 5]), [
            follow(",1", { gap: 2, combo: true }, hit("Triple Jab", "high", 8, [-4, 6, 7])),
            follow(",3", { gap: 3, combo: false, comboCh: true }, hit("Cross Knee", "mid", 14, [-8, 4, KD])),
            follow(",4", { gap: 5, combo: false }, hit("Cross Low Shin", "low", 12, [-13, 3, 3])),
            cancel("~b", "drift", [-1, 5, 7], ["high"]),
          ]),
        ]),
        root("2", first(12, hit("Straight", "high", 10, [-2, 7, 7], { range: 2.1 })), [
          follow(",2", { gap: -1, combo: true }, hit("Double Straight", "mid", 12, [-6, 4, 4]), [
            follow(
              ",3",
              { gap: 1, combo: true },
              hit("Rising Knee", "mid", 20, [-14, LAUNCH, LAUNCH], { tags: ["launcher"] }),
              [cancel("~f", "ember", [e11 ? -3 : -4, 3, 3], ["high", "mid"])],
            ),
            follow(",1+2", { gap: 4, combo: false, comboCh: true }, hit("Double Palm", "mid", 18, [-10, KD, SPLAT])),
          ]),
        ]),
        root("3", first(14, hit("Front Kick", "mid", 14, [-7, 4, 6], { range: 2.1 })), [
          follow(",4", { gap: 4, combo: false, comboCh: true }, hit("Spin Hook", "high", 16, [-3, KD, KD]), [
            cancel("~b", "drift", [2, 8, 8]),
            follow(",3", { gap: 6, combo: false }, hit("Spin Low Kick", "low", 11, [-12, 2, 4]), [
              follow(",4", { gap: 1, combo: true }, hit("Spin Finish", "mid", 18, [-16, KD, KD])),
            ]),
          ]),
        ]),
        root("d+4", first(16, hit("Shin Kick", "low", 9, [e11 ? -13 : -12, 1, 3], { range: 1.2 })), [
          follow(",1", { gap: 7, combo: false }, hit("Shin Rise Jab", "high", 8, [-1, 7, 7]), [
            follow(",2", { gap: 0, combo: true }, hit("Shin Rise Cross", "mid", 13, [-9, 3, KD])),
          ]),
          cancel("~d", "ember", [-6, 4, 6], ["high"]),
        ]),
        root("f+3", first(15, hit("Step Knee", "mid", 15, [-9, 3, 3])), [
          follow(",3", { gap: 2, combo: true }, hit("Step Knee 2", "mid", 12, [-11, 2, 2]), [
            follow(",4", { gap: 3, combo: false, comboCh: true }, hit("Step Sweep", "low", 14, [-17, KD, KD])),
            follow(",2", { gap: 1, combo: true }, hit("Step Elbow", "mid", 17, [-12, CRUMPLE, CRUMPLE]), [
              cancel("~b", "drift", [-5, 4, 4]),
            ]),
          ]),
        ]),
        root("b+1", first(13, hit("Back Fist", "high", 11, [-1, 6, 9])), [
          follow(",2", { gap: 3, combo: false }, hit("Back Fist Cross", "mid", 12, [-7, 5, 5]), [
            follow(",1", { gap: 2, combo: false, comboCh: true }, hit("Back Fist Hammer", "mid", 18, [-13, KD, KD])),
            follow(",3", { gap: 4, combo: false }, hit("Back Fist Sweep", "low", 13, [-14, 3, KD])),
          ]),
        ]),
        root("4", first(12, hit("High Roundhouse", "high", 17, [-8, KD, KD]))),
        root("d+1", first(10, hit("Crouch Jab", "special-mid", 5, [-5, 6, 6], { tags: ["poke"] }))),
        root("uf+4", first(15, hit("Rising Toe", "mid", 15, [-13, LAUNCH, LAUNCH], { tags: ["launcher"] }))),
        root("1+3", first(12, hit("Harbour Toss", "throw", 35, [THROWN(), kd(-2), kd(-2)]))),
        // Stance moves.
        fromStance("drift", ":2", first(11, hit("Drift Lash", "mid", 13, [-2, 7, 7], { range: 2.4 })), [
          follow(",1", { gap: 1, combo: true }, hit("Drift Lash Jab", "high", 8, [0, 8, 8]), [
            cancel("~b", "drift", [1, 6, 6], ["high"]),
          ]),
        ]),
        fromStance("drift", ":4", first(17, hit("Drift Heel", "low", 14, [-15, 4, KD], { range: 1.6 }))),
        fromStance("drift", ":1+2", first(20, hit("Drift Surge", "unblockable", 40, [KD, KD, KD], { range: 1.1 }))),
        fromStance("ember", ":1", first(9, hit("Ember Jab", "special-mid", 6, [-2, 7, 7]))),
        fromStance(
          "ember",
          ":3",
          first(13, hit("Ember Uppercut", "mid", 22, [-15, LAUNCH, LAUNCH], { tags: ["launcher"] })),
        ),
      ],
    };
  },
};

/**
 * Velka: a stance fighter whose strings cycle between her two stances. Shows
 * a gap that lets the defender duck a high (4,4,1), and stance loops.
 */
const velka: DemoCharacter = {
  slug: "velka",
  name: "Velka",
  summary: "Ribbon dancer of the canal quarter: strings that loop between two stances, each with its own guess.",
  data: (ed) => {
    const e11 = ed === "1-1";
    return {
      stances: [
        {
          key: "mirror",
          name: "Mirrorstep",
          abbreviation: "MIR",
          notes: "A sideways glide; mids and highs are guarded on entry.",
        },
        { key: "hollow", name: "Hollow Lean", abbreviation: "HOL", notes: "Deep lean forward with a fast low." },
      ],
      roots: [
        root("1", first(10, hit("Ribbon Jab", "high", 6, [1, 8, 8], { tags: ["poke"] })), [
          follow(",1", { gap: 1, combo: true }, hit("Ribbon Double", "high", 7, [-1, 6, 6]), [
            follow(",2", { gap: 2, combo: true }, hit("Ribbon Palm", "mid", 14, [-9, 4, KD])),
            cancel("~f", "mirror", [2, 9, 9], ["high", "mid"]),
          ]),
        ]),
        root("4", first(13, hit("Lift Kick", "mid", 13, [-5, 5, 5])), [
          follow(",4", { gap: e11 ? 0 : 3, combo: e11, comboCh: true }, hit("Lift Kick 2", "mid", 13, [-8, 3, 5]), [
            follow(",1", { gap: 5, combo: false }, hit("Lift Chop", "high", 12, [-4, KD, KD])),
            follow(",3", { gap: 4, combo: false }, hit("Lift Sweep", "low", 15, [-16, KD, KD])),
            cancel("~d", "hollow", [-3, 5, 5]),
          ]),
        ]),
        root("2", first(12, hit("Sash Strike", "high", 10, [-3, 6, 6])), [
          follow(",3", { gap: 0, combo: true }, hit("Sash Knee", "mid", 14, [-12, 5, 5]), [
            cancel("~f", "mirror", [-2, 6, 6], ["high"]),
            follow(",4", { gap: 2, combo: true }, hit("Sash Wheel", "high", 18, [-6, KD, SPLAT]), [
              follow(",4", { gap: 1, combo: true }, hit("Sash Wheel Finish", "mid", 16, [-14, KD, KD])),
            ]),
          ]),
        ]),
        root("d+3", first(15, hit("Low Ribbon", "low", 10, [-12, 2, 4])), [
          follow(",2", { gap: 6, combo: false }, hit("Low Ribbon Rise", "mid", 14, [-10, 4, 4]), [
            follow(",1", { gap: 3, combo: false, comboCh: true }, hit("Low Ribbon Chop", "high", 12, [-2, KD, KD])),
            cancel("~b", "hollow", [-4, 3, 5], ["low"]),
          ]),
        ]),
        root("f+2", first(14, hit("Lunge Palm", "mid", 15, [-6, 5, 5])), [
          follow(",1", { gap: 3, combo: false }, hit("Lunge Chop", "high", 11, [-3, 6, 6]), [
            follow(",2", { gap: 2, combo: true }, hit("Lunge Twin", "mid", 14, [-11, KD, KD])),
            follow(",4", { gap: 5, combo: false }, hit("Lunge Sweep", "low", 12, [-15, 3, KD])),
          ]),
        ]),
        root("b+4", first(16, hit("Turn Heel", "mid", 17, [-4, 7, KD])), [
          follow(",3", { gap: 2, combo: false, comboCh: true }, hit("Turn Heel Low", "low", 11, [-14, 2, 2]), [
            follow(",4", { gap: 1, combo: true }, hit("Turn Heel Rise", "mid", 18, [-13, LAUNCH, LAUNCH])),
          ]),
          cancel("~f", "mirror", [0, 8, 8]),
        ]),
        root("d+1", first(10, hit("Crouch Flick", "special-mid", 5, [-4, 6, 6], { tags: ["poke"] }))),
        root("uf+3", first(15, hit("Kite Rise", "mid", 14, [-14, LAUNCH, LAUNCH], { tags: ["launcher"] }))),
        root("2+4", first(12, hit("Canal Throw", "throw", 32, [THROWN(), kd(0), kd(0)]))),
        // Stance moves: each can cancel into the other stance, so strings cycle.
        fromStance("mirror", ":1", first(10, hit("Mirror Jab", "high", 7, [1, 8, 8])), [
          cancel("~d", "hollow", [2, 9, 9], ["high"]),
          follow(",2", { gap: 1, combo: true }, hit("Mirror Palm", "mid", 12, [-5, 5, 5])),
        ]),
        fromStance("mirror", ":3", first(16, hit("Mirror Sweep", "low", 13, [-14, 3, KD]))),
        fromStance("mirror", ":4", first(14, hit("Mirror Spin", "mid", 16, [-8, KD, KD])), [
          cancel("~b", "mirror", [-3, 6, 6]),
        ]),
        fromStance("hollow", ":3", first(12, hit("Hollow Shin", "low", 9, [-11, 3, 3])), [
          cancel("~f", "mirror", [-1, 6, 6], ["mid"]),
        ]),
        fromStance(
          "hollow",
          ":2",
          first(13, hit("Hollow Rise", "mid", 19, [-13, LAUNCH, LAUNCH], { tags: ["launcher"] })),
        ),
      ],
    };
  },
};

/**
 * Brannoch: a heavy grappler with slow, damaging strings and two guard
 * stances. Shows long strings that jail (2,1,2), an unblockable, and a new
 * follow-up added in 1.1.
 */
const brannoch: DemoCharacter = {
  slug: "brannoch",
  name: "Brannoch",
  summary: "Foundry wrestler: slow, heavy strings, throws, and stances that guard while he steps in.",
  data: (ed) => {
    const e11 = ed === "1-1";
    return {
      stances: [
        {
          key: "anvil",
          name: "Anvil",
          abbreviation: "ANV",
          notes: "Planted guard; highs and mids are guarded on entry.",
        },
        {
          key: "rampart",
          name: "Rampart",
          abbreviation: "RMP",
          notes: "Shoulder-first advance with a grab and a low.",
        },
      ],
      roots: [
        root("1", first(11, hit("Heavy Jab", "high", 9, [0, 7, 7])), [
          follow(",2", { gap: 1, combo: true }, hit("Heavy Cross", "high", 12, [-5, 4, 4]), [
            follow(",1", { gap: 0, combo: true }, hit("Heavy Hammer", "mid", 20, [-15, KD, KD])),
            follow(",3", { gap: 5, combo: false }, hit("Heavy Stomp", "low", 15, [-18, KD, KD])),
            cancel("~f", "rampart", [-2, 5, 5], ["high"]),
          ]),
        ]),
        root("2", first(13, hit("Foundry Palm", "mid", 14, [-6, 5, 5])), [
          follow(",1", { gap: 0, combo: true }, hit("Foundry Chop", "high", 12, [-8, 4, 4]), [
            follow(",2", { gap: -2, combo: true }, hit("Foundry Press", "mid", 22, [-12, SPLAT, SPLAT]), [
              cancel("~b", "anvil", [-3, 3, 3], ["high", "mid"]),
            ]),
            follow(",4", { gap: 3, combo: false }, hit("Foundry Sweep", "low", 14, [-15, 2, KD])),
          ]),
        ]),
        root("3", first(16, hit("Boot", "mid", 16, [-9, 4, 6])), [
          follow(",3", { gap: 4, combo: false, comboCh: true }, hit("Double Boot", "mid", 16, [-10, KD, KD])),
          follow(",4", { gap: 6, combo: false }, hit("Boot Sweep", "low", 14, [-16, 3, KD]), [
            follow(",1+2", { gap: 8, combo: false }, hit("Boot Slam", "mid", 28, [-20, KD, KD])),
          ]),
          cancel("~b", "anvil", [-1, 6, 6], ["mid"]),
        ]),
        root("d+2", first(15, hit("Low Hammer", "low", 13, [-13, 2, 4])), [
          follow(",2", { gap: 3, combo: false, comboCh: true }, hit("Low Hammer Rise", "mid", 17, [-12, KD, KD]), [
            follow(",1", { gap: 2, combo: false }, hit("Low Hammer Hook", "high", 14, [-6, KD, KD])),
          ]),
          cancel("~f", "rampart", [-5, 4, 4]),
        ]),
        root("f+1", first(12, hit("Shoulder Jab", "high", 10, [-2, 6, 6])), [
          follow(",4", { gap: 2, combo: true }, hit("Shoulder Knee", "mid", 15, [-9, 5, 5]), [
            follow(",2", { gap: 4, combo: false }, hit("Shoulder Ram", "mid", 24, [-7, SPLAT, SPLAT])),
            follow(",3", { gap: 4, combo: false }, hit("Shoulder Trip", "low", 14, [-14, KD, KD])),
          ]),
        ]),
        root("b+2", first(18, hit("Furnace Hook", "mid", 21, [-11, KD, CRUMPLE])), [
          follow(",1", { gap: 5, combo: false, comboCh: true }, hit("Furnace Jab", "high", 10, [-4, 6, 6]), [
            follow(",2", { gap: 1, combo: true }, hit("Furnace Crush", "mid", 26, [-16, KD, KD])),
          ]),
          cancel("~b", "anvil", [-4, 4, 4], ["high"]),
        ]),
        root("4", first(14, hit("Axe Kick", "mid", 18, [-5, KD, KD]))),
        root("d+1", first(11, hit("Crouch Thump", "special-mid", 7, [-4, 5, 5]))),
        root("1+2", first(30, hit("Crucible Blow", "unblockable", 45, [KD, KD, KD]))),
        root("1+3", first(12, hit("Foundry Suplex", "throw", 40, [THROWN(), kd(-4), kd(-4)]))),
        // Stance moves.
        fromStance("anvil", ":1", first(12, hit("Anvil Jab", "high", 10, [1, 7, 7])), [
          follow(",2", { gap: 1, combo: true }, hit("Anvil Cross", "mid", 16, [-7, 5, 5])),
          ...(e11 ? [follow(",4", { gap: 3, combo: false }, hit("Anvil Low Boot", "low", 12, [-13, 3, 3]))] : []),
        ]),
        fromStance("anvil", ":2", first(15, hit("Anvil Press", "mid", 20, [-12, KD, KD])), [
          cancel("~f", "rampart", [-2, 5, 5]),
        ]),
        fromStance("rampart", ":3", first(14, hit("Rampart Trip", "low", 12, [-12, 3, 3])), [
          cancel("~b", "anvil", [-3, 4, 4], ["high", "mid"]),
        ]),
        fromStance("rampart", ":1+3", first(13, hit("Rampart Grab", "throw", 36, [THROWN(), kd(-3), kd(-3)]))),
        fromStance("rampart", ":2", first(16, hit("Rampart Ram", "mid", 24, [-8, SPLAT, SPLAT]))),
      ],
    };
  },
};

export const DEMO_CHARACTERS: DemoCharacter[] = [tarrow, velka, brannoch];
