import { z } from "zod";

export const LEVELS = ["high", "mid", "low", "special-mid", "throw", "unblockable"] as const;
export const STATES = ["knockdown", "launch", "wall-splat", "crumple", "throw"] as const;

export const levelSchema = z.enum(LEVELS);
export const stateSchema = z.enum(STATES);

// Frame counts are whole frames; a fractional advantage is always a data-entry slip.
const frames = z.number().int();
const id = z.string().min(1, "an id must not be empty");

export const outcomeSchema = z.union([frames, z.object({ state: stateSchema, frames: frames.optional() })]);

export const moveNodeSchema = z.object({
  id,
  kind: z.literal("move"),
  input: z.string(),
  level: levelSchema,
  damage: z.number().finite(),
  startup: frames.optional(),
  onBlock: outcomeSchema,
  onHit: outcomeSchema,
  onCounterHit: outcomeSchema,
  name: z.string().optional(),
  // Games express range either as a distance or as a label; both are display-only here.
  range: z.union([z.number().finite(), z.string()]).optional(),
  tags: z.array(z.string()).optional(),
  notes: z.string().optional(),
});

export const stanceNodeSchema = z.object({
  id,
  kind: z.literal("stance"),
  name: z.string(),
});

export const nodeSchema = z.discriminatedUnion("kind", [moveNodeSchema, stanceNodeSchema]);

export const followEdgeSchema = z.object({
  id,
  kind: z.literal("follow"),
  from: id,
  to: id,
  input: z.string(),
  gapOnBlock: frames,
  comboOnHit: z.boolean(),
  comboOnCounterHit: z.boolean(),
});

export const cancelEdgeSchema = z.object({
  id,
  kind: z.literal("cancel"),
  from: id,
  to: id,
  input: z.string(),
  onBlock: outcomeSchema,
  onHit: outcomeSchema,
  onCounterHit: outcomeSchema,
  autoGuard: z.array(levelSchema),
});

export const enterEdgeSchema = z.object({
  id,
  kind: z.literal("enter"),
  from: id,
  to: id,
  input: z.string(),
});

export const edgeSchema = z.discriminatedUnion("kind", [followEdgeSchema, cancelEdgeSchema, enterEdgeSchema]);

type NodeShape = z.infer<typeof nodeSchema>;
type EdgeShape = z.infer<typeof edgeSchema>;

export interface GraphIssue {
  message: string;
  path: (string | number)[];
}

const EDGE_RULES = {
  follow: { from: "move", to: "move" },
  cancel: { from: "move", to: "stance" },
  enter: { from: "stance", to: "move" },
} as const;

/**
 * Checks that a well-typed graph is also consistent. Shared by the zod schema and by
 * the engine itself, so a caller that skips validation still gets a message naming the id.
 */
export function graphIssues(graph: { nodes: readonly NodeShape[]; edges: readonly EdgeShape[] }): GraphIssue[] {
  const issues: GraphIssue[] = [];
  const kinds = new Map<string, "move" | "stance">();
  graph.nodes.forEach((node, i) => {
    if (kinds.has(node.id)) {
      issues.push({ message: `duplicate node id "${node.id}"`, path: ["nodes", i, "id"] });
    } else {
      kinds.set(node.id, node.kind);
    }
    if (node.kind === "move") {
      if (node.startup !== undefined && node.startup < 0) {
        issues.push({
          message: `move "${node.id}": startup must not be negative (got ${node.startup})`,
          path: ["nodes", i, "startup"],
        });
      }
      if (node.damage < 0) {
        issues.push({
          message: `move "${node.id}": damage must not be negative (got ${node.damage})`,
          path: ["nodes", i, "damage"],
        });
      }
    }
  });
  const edgeIds = new Set<string>();
  graph.edges.forEach((edge, i) => {
    if (edgeIds.has(edge.id)) {
      issues.push({ message: `duplicate edge id "${edge.id}"`, path: ["edges", i, "id"] });
    }
    edgeIds.add(edge.id);
    const rule = EDGE_RULES[edge.kind];
    for (const end of ["from", "to"] as const) {
      const nodeId = edge[end];
      const kind = kinds.get(nodeId);
      if (kind === undefined) {
        issues.push({
          message: `${edge.kind} edge "${edge.id}": ${end} "${nodeId}" is not a node of the graph`,
          path: ["edges", i, end],
        });
      } else if (kind !== rule[end]) {
        const verb = end === "from" ? "starts at" : "leads into";
        issues.push({
          message: `${edge.kind} edge "${edge.id}" ${verb} ${kind} "${nodeId}"; a ${edge.kind} edge ${verb} a ${rule[end]}`,
          path: ["edges", i, end],
        });
      }
    }
  });
  return issues;
}

export const graphSchema = z
  .object({ nodes: z.array(nodeSchema), edges: z.array(edgeSchema) })
  .superRefine((graph, ctx) => {
    for (const issue of graphIssues(graph)) {
      ctx.addIssue({ code: "custom", message: issue.message, path: issue.path });
    }
  });

export const MAX_DEPTH_LIMIT = 64;
export const MAX_STANCE_VISITS_LIMIT = 16;

export const optionsSchema = z
  .object({
    maxDepth: z.number().int().min(1).max(MAX_DEPTH_LIMIT).default(8),
    maxStanceVisits: z.number().int().min(0).max(MAX_STANCE_VISITS_LIMIT).default(1),
    fastest: z.number().int().min(1).default(10),
    launchAt: z.number().int().min(1).default(15),
  })
  .refine((o) => o.launchAt >= o.fastest, {
    message: "launchAt must be at least fastest: a launch punish is also a punish",
    path: ["launchAt"],
  });

/** Request body for exploring paths over the network; the route handler adds auth and loading. */
export const exploreRequestSchema = z.object({
  graph: graphSchema,
  rootId: id,
  options: optionsSchema.optional(),
  limit: z.number().int().min(1).max(1_000_000).optional(),
});

export function parseGraph(input: unknown) {
  return graphSchema.safeParse(input);
}

export function parseOptions(input: unknown) {
  return optionsSchema.safeParse(input ?? {});
}
