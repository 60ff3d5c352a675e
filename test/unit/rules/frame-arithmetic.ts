import ts from "typescript";

/**
 * Finds code that computes a frame figure itself: arithmetic (`+ - * /`, `%`, unary minus or
 * plus, `Math.*`, `+=` and kin) or an ordering comparison (`< <= > >=`) with an operand that
 * is a frame figure. Frame rules live in the engine (`src/lib/engine/frames.ts`); everything
 * else calls it.
 *
 * A frame figure is a name in {@link FRAME_NAME} (a property read counts by its last name:
 * `path.onBlock` is one, `path.gaps.length` is not), or a local name that holds one: a
 * variable or parameter whose initializer or type mentions a frame figure (`const a =
 * path.onBlock`, `o: Outcome`), followed through the file until nothing new is found.
 * A call's result is the callee's business (`formatFrames(a) + "f"` is not flagged), except
 * `Math.*` (arithmetic itself), `Number()` and kin of a frame figure, and the engine's helpers
 * that return one (`framesSaved(c, m) + 1` computes with it).
 */

/**
 * Names of frame figures: the graph's and the engine's frame fields, the rules' thresholds, and
 * any name built on them (`hitOnBlock`, `saves`, `gapAfter`); `frames` alone, as in `gap.frames`.
 */
export const FRAME_NAME = /onBlock|onHit|CounterHit|startup|saved|saves|gap|advantage|fastest|launchAt|^frames$/i;
/** Types that carry frame figures: a parameter or variable of one of these holds frames. */
const FRAME_TYPE = /\bOutcome\b|\["(onBlock|onHit|onCounterHit|startup|framesSaved)"\]/;

const ARITHMETIC = new Set([
  ts.SyntaxKind.PlusToken,
  ts.SyntaxKind.MinusToken,
  ts.SyntaxKind.AsteriskToken,
  ts.SyntaxKind.SlashToken,
  ts.SyntaxKind.PercentToken,
  ts.SyntaxKind.PlusEqualsToken,
  ts.SyntaxKind.MinusEqualsToken,
  ts.SyntaxKind.AsteriskEqualsToken,
  ts.SyntaxKind.SlashEqualsToken,
  ts.SyntaxKind.LessThanToken,
  ts.SyntaxKind.LessThanEqualsToken,
  ts.SyntaxKind.GreaterThanToken,
  ts.SyntaxKind.GreaterThanEqualsToken,
]);

export interface Finding {
  file: string;
  line: number;
  /** The offending expression's source text. */
  text: string;
}

function unwrap(e: ts.Expression): ts.Expression {
  let x = e;
  while (ts.isParenthesizedExpression(x) || ts.isAsExpression(x) || ts.isNonNullExpression(x)) x = x.expression;
  return x;
}

function isMathCall(e: ts.Node): e is ts.CallExpression {
  return (
    ts.isCallExpression(e) &&
    ts.isPropertyAccessExpression(e.expression) &&
    ts.isIdentifier(e.expression.expression) &&
    e.expression.expression.text === "Math"
  );
}

/** Calls that hand a number on: of their arguments (`Number(onBlock)`), or a frame figure the engine computed. */
const CONVERTS = new Set(["Number", "parseInt", "parseFloat"]);
const ENGINE_FIGURE = new Set(["framesSaved", "gapAtAdvantage", "punishWindow", "outcomeFrames", "effectiveLaunchAt"]);

function callsForFrames(e: ts.CallExpression, held: ReadonlySet<string>): boolean {
  const callee = ts.isIdentifier(e.expression) ? e.expression.text : null;
  if (callee !== null && ENGINE_FIGURE.has(callee)) return true;
  const converts = isMathCall(e) || (callee !== null && CONVERTS.has(callee));
  return converts && e.arguments.some((a) => mentionsFrames(a, held));
}

/**
 * Whether an operand reads a frame figure, given the local names known to hold one. `deep`
 * also looks into calls (for what a variable holds: `const a = outcomeFrames(advantage)`).
 */
function mentionsFrames(e: ts.Node, held: ReadonlySet<string>, deep = false): boolean {
  if (ts.isTypeNode(e)) return false;
  if (ts.isIdentifier(e)) return FRAME_NAME.test(e.text) || held.has(e.text);
  if (ts.isPropertyAccessExpression(e)) return FRAME_NAME.test(e.name.text);
  if (ts.isElementAccessExpression(e)) return mentionsFrames(e.argumentExpression, held);
  if (ts.isCallExpression(e) && !deep) return callsForFrames(e, held);
  // Text is text: a template or string literal is not a number, whatever it quotes.
  if (ts.isTemplateExpression(e) || ts.isStringLiteralLike(e)) return false;
  if (ts.isFunctionLike(e)) return false;
  let found = false;
  ts.forEachChild(e, (c) => {
    if (!found && mentionsFrames(c, held, deep)) found = true;
  });
  return found;
}

function bindingNames(name: ts.BindingName, out: string[]): string[] {
  if (ts.isIdentifier(name)) out.push(name.text);
  else for (const el of name.elements) if (!ts.isOmittedExpression(el)) bindingNames(el.name, out);
  return out;
}

/** The local names that hold frame figures, by their initializer or their type, to a fixed point. */
function framesHeld(source: ts.SourceFile): Set<string> {
  const decls: { names: string[]; init: ts.Node | undefined; type: string }[] = [];
  const visit = (n: ts.Node) => {
    if (ts.isVariableDeclaration(n) || ts.isParameter(n)) {
      decls.push({ names: bindingNames(n.name, []), init: n.initializer, type: n.type?.getText(source) ?? "" });
    }
    ts.forEachChild(n, visit);
  };
  visit(source);
  const held = new Set<string>();
  for (let grew = true; grew;) {
    grew = false;
    for (const d of decls) {
      if (d.names.every((n) => held.has(n))) continue;
      const holds = FRAME_TYPE.test(d.type) || (d.init !== undefined && mentionsFrames(d.init, held, true));
      if (!holds) continue;
      for (const n of d.names) if (!held.has(n)) (held.add(n), (grew = true));
    }
  }
  return held;
}

/** Every place in one source text that computes with a frame figure. */
export function findFrameArithmetic(file: string, text: string): Finding[] {
  const kind = file.endsWith(".tsx") ? ts.ScriptKind.TSX : ts.ScriptKind.TS;
  const source = ts.createSourceFile(file, text, ts.ScriptTarget.Latest, true, kind);
  const held = framesHeld(source);
  const out: Finding[] = [];
  const flag = (n: ts.Node) =>
    out.push({
      file,
      line: source.getLineAndCharacterOfPosition(n.getStart(source)).line + 1,
      text: n.getText(source),
    });
  const visit = (n: ts.Node) => {
    if (ts.isBinaryExpression(n) && ARITHMETIC.has(n.operatorToken.kind)) {
      const l = unwrap(n.left);
      const r = unwrap(n.right);
      // `"text" + figure` joins text; it computes nothing.
      const joinsText =
        n.operatorToken.kind === ts.SyntaxKind.PlusToken &&
        [l, r].some((x) => ts.isStringLiteralLike(x) || ts.isTemplateExpression(x));
      if (!joinsText && (mentionsFrames(l, held) || mentionsFrames(r, held))) flag(n);
    } else if (
      ts.isPrefixUnaryExpression(n) &&
      (n.operator === ts.SyntaxKind.MinusToken || n.operator === ts.SyntaxKind.PlusToken) &&
      mentionsFrames(unwrap(n.operand), held)
    ) {
      flag(n);
    } else if (isMathCall(n) && n.arguments.some((a) => mentionsFrames(a, held))) {
      flag(n);
    }
    ts.forEachChild(n, visit);
  };
  visit(source);
  return out;
}
