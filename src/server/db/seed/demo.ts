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
 *
 * Notation. Five buttons, named for a lamplighter's kit: `n` Needle (quick
 * lead hand), `v` Vane (swinging rear arm), `t` Tread (lead leg), `r` Reel
 * (turning kick), `c` Clasp (grab). Buttons pressed together are written
 * together (`nv`). Directions are words joined to the button by `+`: `press`
 * toward the opponent, `ebb` away, `sink` down (also done from a crouch),
 * `rise` up out of a crouch (only from one), as in `sink+r`. Hits of a string
 * are joined by `.` (`v.v.t`), a cancel into a stance is `~` and a direction
 * (`v.v.t~press`), and a move done from a stance is the stance's code, `:` and
 * its input (`drift:v`).
 * A move's key is its whole notation.
 */

export const DEMO_GAME = {
  slug: "vesper-circuit",
  name: "Vesper Circuit",
  summary:
    "An invented 3D fighting game used as Framefork's demo: three fighters, stance cancels with auto-guard, and two editions that differ.",
  fps: 60,
  fastest: 11,
  launchAt: 16,
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
      "Tarrow's v.v.t~press into Ember Guard is safer (-4 to -3 on block) and his Shin Kick (sink+r) recovers slower (-12 to -13); Quessaline's r.r gap closes (3 frames to none, now a natural combo); Brannoch gets a new Anvil follow-up, anvil:n.r.",
  },
];

export interface DemoCharacter {
  slug: string;
  name: string;
  summary: string;
  data: (edition: EditionSlug) => CharacterData;
}

/**
 * Tarrow: a close-range striker. Shows a mid/low guess after n.v, a natural
 * combo (v.v.t), a cancel that turns a punishable ending safe (v.v.t~press)
 * and one that turns minus into plus (t.r~ebb).
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
        {
          key: "drift",
          name: "Drift",
          abbreviation: "drift",
          notes: "Leaning back-step; highs pass over him on entry.",
        },
        {
          key: "ember",
          name: "Ember Guard",
          abbreviation: "ember",
          notes: "Low crouching guard with a fast mid and a launcher.",
        },
      ],
      roots: [
        root("n", first(11, hit("Needle Jab", "high", 7, [1, 8, 8], { range: 1.1, tags: ["poke"] })), [
          follow(".v", { gap: 0, combo: true }, hit("Jab Cross", "high", 9, [-3, 5, 5], { range: 1.6 }), [
            follow(".n", { gap: 2, combo: true }, hit("Triple Jab", "high", 8, [-4, 6, 7], { range: 1.2 })),
            follow(
              ".t",
              { gap: 3, combo: false, comboCh: true },
              hit("Cross Knee", "mid", 14, [-8, 4, KD], { range: 1.4 }),
            ),
            follow(".r", { gap: 5, combo: false }, hit("Cross Low Shin", "low", 12, [-13, 3, 3], { range: 1.4 })),
            cancel("~ebb", "drift", [-1, 5, 7], ["high"]),
          ]),
        ]),
        root("v", first(12, hit("Straight", "high", 10, [-2, 7, 7], { range: 1.7 })), [
          follow(".v", { gap: -1, combo: true }, hit("Double Straight", "mid", 12, [-6, 4, 4], { range: 1.7 }), [
            follow(
              ".t",
              { gap: 1, combo: true },
              hit("Rising Knee", "mid", 20, [-14, LAUNCH, LAUNCH], { range: 1.5, tags: ["launcher"] }),
              [cancel("~press", "ember", [e11 ? -3 : -4, 3, 3], ["high", "mid"])],
            ),
            follow(
              ".nv",
              { gap: 4, combo: false, comboCh: true },
              hit("Double Palm", "mid", 18, [-11, KD, SPLAT], { range: 1.7 }),
            ),
          ]),
        ]),
        root("t", first(14, hit("Front Kick", "mid", 14, [-7, 4, 6], { range: 2.3 })), [
          follow(
            ".r",
            { gap: 4, combo: false, comboCh: true },
            hit("Spin Hook", "high", 16, [-3, KD, KD], { range: 2.6 }),
            [
              cancel("~ebb", "drift", [2, 8, 8]),
              follow(".t", { gap: 6, combo: false }, hit("Spin Low Kick", "low", 11, [-12, 2, 4], { range: 2.3 }), [
                follow(".r", { gap: 1, combo: true }, hit("Spin Finish", "mid", 18, [-16, KD, KD], { range: 2.6 })),
              ]),
            ],
          ),
        ]),
        root("sink+r", first(16, hit("Shin Kick", "low", 9, [e11 ? -13 : -12, 1, 3], { range: 1.4 })), [
          follow(".n", { gap: 7, combo: false }, hit("Shin Rise Jab", "high", 8, [-1, 7, 7], { range: 1.3 }), [
            follow(".v", { gap: 0, combo: true }, hit("Shin Rise Cross", "mid", 13, [-9, 3, KD], { range: 1.5 })),
          ]),
          cancel("~sink", "ember", [-6, 4, 6], ["high"]),
        ]),
        root("press+t", first(15, hit("Step Knee", "mid", 15, [-9, 3, 3], { range: 1.4 })), [
          follow(".t", { gap: 2, combo: true }, hit("Step Knee 2", "mid", 12, [-11, 2, 2], { range: 1.4 }), [
            follow(
              ".r",
              { gap: 3, combo: false, comboCh: true },
              hit("Step Sweep", "low", 14, [-17, KD, KD], { range: 2.8 }),
            ),
            follow(
              ".v",
              { gap: 1, combo: true },
              hit("Step Elbow", "mid", 17, [-12, CRUMPLE, CRUMPLE], { range: 1.7 }),
              [cancel("~ebb", "drift", [-5, 4, 4])],
            ),
          ]),
        ]),
        root("ebb+n", first(13, hit("Back Fist", "high", 11, [-1, 6, 9], { range: 1.7 })), [
          follow(".v", { gap: 3, combo: false }, hit("Back Fist Cross", "mid", 12, [-7, 5, 5], { range: 1.7 }), [
            follow(
              ".n",
              { gap: 2, combo: false, comboCh: true },
              hit("Back Fist Hammer", "mid", 18, [-13, KD, KD], { range: 1.7 }),
            ),
            follow(".t", { gap: 4, combo: false }, hit("Back Fist Sweep", "low", 13, [-14, 3, KD], { range: 2.8 })),
          ]),
        ]),
        root("r", first(12, hit("High Roundhouse", "high", 17, [-8, KD, KD], { range: 2.6 }))),
        root("sink+n", first(12, hit("Low Needle", "special-mid", 6, [-4, 5, 5], { range: 1.2, tags: ["poke"] }))),
        root(
          "rise+r",
          first(15, hit("Rising Toe", "mid", 15, [-13, LAUNCH, LAUNCH], { range: 2.3, tags: ["launcher"] })),
        ),
        root("c", first(12, hit("Harbour Toss", "throw", 35, [THROWN(), kd(-2), kd(-2)], { range: 0.9 }))),
        // Stance moves.
        fromStance("drift", ":v", first(11, hit("Drift Lash", "mid", 13, [-2, 7, 7], { range: 1.7 })), [
          follow(".n", { gap: 1, combo: true }, hit("Drift Lash Jab", "high", 8, [0, 8, 8], { range: 1.1 }), [
            cancel("~ebb", "drift", [1, 6, 6], ["high"]),
          ]),
        ]),
        fromStance("drift", ":r", first(17, hit("Drift Heel", "low", 14, [-16, 4, KD], { range: 2.3 }))),
        fromStance("drift", ":nv", first(20, hit("Drift Surge", "unblockable", 40, [KD, KD, KD], { range: 2.0 }))),
        fromStance("ember", ":n", first(10, hit("Ember Jab", "special-mid", 6, [-2, 7, 7], { range: 1.1 }))),
        fromStance(
          "ember",
          ":t",
          first(13, hit("Ember Uppercut", "mid", 22, [-16, LAUNCH, LAUNCH], { range: 1.5, tags: ["launcher"] })),
        ),
      ],
    };
  },
};

/**
 * Quessaline: a stance fighter whose strings cycle between her two stances.
 * Shows a gap that lets the defender duck a high (r.r.n), and stance loops.
 */
const quessaline: DemoCharacter = {
  slug: "quessaline",
  name: "Quessaline",
  summary: "Ribbon dancer of the canal quarter: strings that loop between two stances, each with its own guess.",
  data: (ed) => {
    const e11 = ed === "1-1";
    return {
      stances: [
        {
          key: "mirror",
          name: "Mirrorstep",
          abbreviation: "mirror",
          notes: "A sideways glide; mids and highs are guarded on entry.",
        },
        { key: "hollow", name: "Hollow Lean", abbreviation: "hollow", notes: "Deep lean forward with a fast low." },
      ],
      roots: [
        root("n", first(11, hit("Ribbon Jab", "high", 6, [1, 8, 8], { range: 1.1, tags: ["poke"] })), [
          follow(".n", { gap: 1, combo: true }, hit("Ribbon Double", "high", 7, [-1, 6, 6], { range: 1.7 }), [
            follow(".v", { gap: 2, combo: true }, hit("Ribbon Palm", "mid", 14, [-9, 4, KD], { range: 1.7 })),
            cancel("~press", "mirror", [2, 9, 9], ["high", "mid"]),
          ]),
        ]),
        root("r", first(13, hit("Lift Kick", "mid", 13, [-5, 5, 5], { range: 2.3 })), [
          follow(
            ".r",
            { gap: e11 ? 0 : 3, combo: e11, comboCh: true },
            hit("Lift Kick 2", "mid", 13, [-8, 3, 5], { range: 2.3 }),
            [
              follow(".n", { gap: 5, combo: false }, hit("Lift Chop", "high", 12, [-4, KD, KD], { range: 1.7 })),
              follow(".t", { gap: 4, combo: false }, hit("Lift Sweep", "low", 15, [-16, KD, KD], { range: 2.8 })),
              cancel("~sink", "hollow", [-3, 5, 5]),
            ],
          ),
        ]),
        root("v", first(12, hit("Sash Strike", "high", 10, [-3, 6, 6], { range: 1.7 })), [
          follow(".t", { gap: 0, combo: true }, hit("Sash Knee", "mid", 14, [-12, 5, 5], { range: 1.4 }), [
            cancel("~press", "mirror", [-2, 6, 6], ["high"]),
            follow(".r", { gap: 2, combo: true }, hit("Sash Wheel", "high", 18, [-6, KD, SPLAT], { range: 2.6 }), [
              follow(".r", { gap: 1, combo: true }, hit("Sash Wheel Finish", "mid", 16, [-14, KD, KD], { range: 2.6 })),
            ]),
          ]),
        ]),
        root("sink+t", first(15, hit("Low Ribbon", "low", 10, [-12, 2, 4], { range: 2.4 })), [
          follow(".v", { gap: 6, combo: false }, hit("Low Ribbon Rise", "mid", 14, [-11, 4, 4], { range: 1.5 }), [
            follow(
              ".n",
              { gap: 3, combo: false, comboCh: true },
              hit("Low Ribbon Chop", "high", 12, [-2, KD, KD], { range: 1.4 }),
            ),
            cancel("~ebb", "hollow", [-4, 3, 5], ["low"]),
          ]),
        ]),
        root("press+v", first(14, hit("Lunge Palm", "mid", 15, [-6, 5, 5], { range: 3.1 })), [
          follow(".n", { gap: 3, combo: false }, hit("Lunge Chop", "high", 11, [-3, 6, 6], { range: 2.0 }), [
            follow(".v", { gap: 2, combo: true }, hit("Lunge Twin", "mid", 14, [-11, KD, KD], { range: 2.2 })),
            follow(".r", { gap: 5, combo: false }, hit("Lunge Sweep", "low", 12, [-16, 3, KD], { range: 3.4 })),
          ]),
        ]),
        root("ebb+r", first(16, hit("Turn Heel", "mid", 17, [-4, 7, KD], { range: 2.6 })), [
          follow(
            ".t",
            { gap: 2, combo: false, comboCh: true },
            hit("Turn Heel Low", "low", 11, [-14, 2, 2], { range: 2.3 }),
            [
              follow(
                ".r",
                { gap: 1, combo: true },
                hit("Turn Heel Rise", "mid", 18, [-13, LAUNCH, LAUNCH], { range: 2.3 }),
              ),
            ],
          ),
          cancel("~press", "mirror", [0, 8, 8]),
        ]),
        root("sink+n", first(12, hit("Crouch Flick", "special-mid", 5, [-3, 6, 6], { range: 1.4, tags: ["poke"] }))),
        root(
          "rise+t",
          first(15, hit("Kite Rise", "mid", 14, [-14, LAUNCH, LAUNCH], { range: 1.5, tags: ["launcher"] })),
        ),
        root("c", first(12, hit("Canal Throw", "throw", 32, [THROWN(), kd(0), kd(0)], { range: 0.9 }))),
        // Stance moves: each can cancel into the other stance, so strings cycle.
        fromStance("mirror", ":n", first(11, hit("Mirror Jab", "high", 7, [1, 8, 8], { range: 1.1 })), [
          cancel("~sink", "hollow", [2, 9, 9], ["high"]),
          follow(".v", { gap: 1, combo: true }, hit("Mirror Palm", "mid", 12, [-5, 5, 5], { range: 1.7 })),
        ]),
        fromStance("mirror", ":t", first(16, hit("Mirror Sweep", "low", 13, [-14, 3, KD], { range: 2.8 }))),
        fromStance("mirror", ":r", first(14, hit("Mirror Spin", "mid", 16, [-8, KD, KD], { range: 1.7 })), [
          cancel("~ebb", "mirror", [-3, 6, 6]),
        ]),
        fromStance("hollow", ":t", first(12, hit("Hollow Shin", "low", 9, [-11, 3, 3], { range: 1.4 })), [
          cancel("~press", "mirror", [-1, 6, 6], ["mid"]),
        ]),
        fromStance(
          "hollow",
          ":v",
          first(13, hit("Hollow Rise", "mid", 19, [-13, LAUNCH, LAUNCH], { range: 1.5, tags: ["launcher"] })),
        ),
      ],
    };
  },
};

/**
 * Brannoch: a heavy grappler with slow, damaging strings and two guard
 * stances. Shows long strings that jail (v.n.v), an unblockable, and a new
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
          abbreviation: "anvil",
          notes: "Planted guard; highs and mids are guarded on entry.",
        },
        {
          key: "rampart",
          name: "Rampart",
          abbreviation: "rampart",
          notes: "Shoulder-first advance with a grab and a low.",
        },
      ],
      roots: [
        root("n", first(11, hit("Heavy Jab", "high", 9, [0, 7, 7], { range: 1.1 })), [
          follow(".v", { gap: 1, combo: true }, hit("Heavy Cross", "high", 12, [-5, 4, 4], { range: 1.7 }), [
            follow(".n", { gap: 0, combo: true }, hit("Heavy Hammer", "mid", 20, [-16, KD, KD], { range: 1.7 })),
            follow(".t", { gap: 5, combo: false }, hit("Heavy Stomp", "low", 15, [-18, KD, KD], { range: 2.8 })),
            cancel("~press", "rampart", [-2, 5, 5], ["high"]),
          ]),
        ]),
        root("v", first(13, hit("Foundry Palm", "mid", 14, [-6, 5, 5], { range: 1.7 })), [
          follow(".n", { gap: 0, combo: true }, hit("Foundry Chop", "high", 12, [-8, 4, 4], { range: 1.7 }), [
            follow(
              ".v",
              { gap: -2, combo: true },
              hit("Foundry Press", "mid", 22, [-12, SPLAT, SPLAT], { range: 1.7 }),
              [cancel("~ebb", "anvil", [-3, 3, 3], ["high", "mid"])],
            ),
            follow(".r", { gap: 3, combo: false }, hit("Foundry Sweep", "low", 14, [-16, 2, KD], { range: 2.8 })),
          ]),
        ]),
        root("t", first(16, hit("Boot", "mid", 16, [-9, 4, 6], { range: 2.3 })), [
          follow(
            ".t",
            { gap: 4, combo: false, comboCh: true },
            hit("Double Boot", "mid", 16, [-11, KD, KD], { range: 2.3 }),
          ),
          follow(".r", { gap: 6, combo: false }, hit("Boot Sweep", "low", 14, [-16, 3, KD], { range: 2.8 }), [
            follow(".nv", { gap: 8, combo: false }, hit("Boot Slam", "mid", 28, [-20, KD, KD], { range: 2.3 })),
          ]),
          cancel("~ebb", "anvil", [-1, 6, 6], ["mid"]),
        ]),
        root("sink+v", first(15, hit("Low Hammer", "low", 13, [-13, 2, 4], { range: 1.6 })), [
          follow(
            ".v",
            { gap: 3, combo: false, comboCh: true },
            hit("Low Hammer Rise", "mid", 17, [-12, KD, KD], { range: 1.5 }),
            [follow(".n", { gap: 2, combo: false }, hit("Low Hammer Hook", "high", 14, [-6, KD, KD], { range: 1.4 }))],
          ),
          cancel("~press", "rampart", [-5, 4, 4]),
        ]),
        root("press+n", first(12, hit("Shoulder Jab", "high", 10, [-2, 6, 6], { range: 1.9 })), [
          follow(".r", { gap: 2, combo: true }, hit("Shoulder Knee", "mid", 15, [-9, 5, 5], { range: 1.9 }), [
            follow(".v", { gap: 4, combo: false }, hit("Shoulder Ram", "mid", 24, [-7, SPLAT, SPLAT], { range: 1.9 })),
            follow(".t", { gap: 4, combo: false }, hit("Shoulder Trip", "low", 14, [-14, KD, KD], { range: 2.8 })),
          ]),
        ]),
        root("ebb+v", first(18, hit("Furnace Hook", "mid", 21, [-11, KD, CRUMPLE], { range: 1.7 })), [
          follow(
            ".n",
            { gap: 5, combo: false, comboCh: true },
            hit("Furnace Jab", "high", 10, [-4, 6, 6], { range: 1.1 }),
            [follow(".v", { gap: 1, combo: true }, hit("Furnace Crush", "mid", 26, [-16, KD, KD], { range: 1.7 }))],
          ),
          cancel("~ebb", "anvil", [-4, 4, 4], ["high"]),
        ]),
        root("r", first(14, hit("Axe Kick", "mid", 18, [-5, KD, KD], { range: 2.6 }))),
        root("sink+n", first(13, hit("Crouch Thump", "special-mid", 7, [-5, 5, 5], { range: 1.4 }))),
        root("nv", first(30, hit("Crucible Blow", "unblockable", 45, [KD, KD, KD], { range: 2.0 }))),
        root("c", first(12, hit("Foundry Suplex", "throw", 40, [THROWN(), kd(-4), kd(-4)], { range: 0.9 }))),
        // Stance moves.
        fromStance("anvil", ":n", first(12, hit("Anvil Jab", "high", 10, [1, 7, 7], { range: 1.1 })), [
          follow(".v", { gap: 1, combo: true }, hit("Anvil Cross", "mid", 16, [-7, 5, 5], { range: 1.7 })),
          ...(e11
            ? [follow(".r", { gap: 3, combo: false }, hit("Anvil Low Boot", "low", 12, [-13, 3, 3], { range: 2.3 }))]
            : []),
        ]),
        fromStance("anvil", ":v", first(15, hit("Anvil Press", "mid", 20, [-12, KD, KD], { range: 1.7 })), [
          cancel("~press", "rampart", [-2, 5, 5]),
        ]),
        fromStance("rampart", ":t", first(14, hit("Rampart Trip", "low", 12, [-12, 3, 3], { range: 2.8 })), [
          cancel("~ebb", "anvil", [-3, 4, 4], ["high", "mid"]),
        ]),
        fromStance(
          "rampart",
          ":c",
          first(13, hit("Rampart Grab", "throw", 36, [THROWN(), kd(-3), kd(-3)], { range: 0.9 })),
        ),
        fromStance("rampart", ":v", first(16, hit("Rampart Ram", "mid", 24, [-8, SPLAT, SPLAT], { range: 1.9 }))),
      ],
    };
  },
};

export const DEMO_CHARACTERS: DemoCharacter[] = [tarrow, quessaline, brannoch];
