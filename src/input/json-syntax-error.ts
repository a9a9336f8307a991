/**
 * Where invalid JSON first goes wrong, found without recursion.
 *
 * `JSON.parse` says only that text is invalid, not where. jsonc-parser's `parse` says where, but
 * it recurses once per nesting level, so 10 000 unclosed brackets overflow the call stack
 * (hardening defect I). This walk uses jsonc-parser's scanner (tokens, string escapes, numbers)
 * with an explicit stack of open containers, and stops at the first error, which it reports
 * with the offset and code that jsonc-parser's `parse` (comments and trailing commas refused)
 * gives as its first error. test/input/json-syntax-error.test.ts compares the two.
 */
import { createScanner, ParseErrorCode, ScanError, SyntaxKind } from "jsonc-parser";

/** The first syntax error of a JSON text. */
export interface JsonSyntaxError {
  /** Offset of the offending token [UTF-16 code units from the start of the text]. */
  offset: number;
  /** jsonc-parser's code for it (print with `printParseErrorCode`). */
  error: ParseErrorCode;
}

/** Parse errors that the scanner reports on a token it still returns. */
const SCAN_ERRORS: Partial<Record<ScanError, ParseErrorCode>> = {
  [ScanError.InvalidUnicode]: ParseErrorCode.InvalidUnicode,
  [ScanError.InvalidEscapeCharacter]: ParseErrorCode.InvalidEscapeCharacter,
  [ScanError.UnexpectedEndOfNumber]: ParseErrorCode.UnexpectedEndOfNumber,
  [ScanError.UnexpectedEndOfString]: ParseErrorCode.UnexpectedEndOfString,
  [ScanError.InvalidCharacter]: ParseErrorCode.InvalidCharacter,
};

/** An open array or object, and whether its next member must follow a comma. */
interface OpenContainer {
  closer: SyntaxKind.CloseBracketToken | SyntaxKind.CloseBraceToken;
  needsComma: boolean;
}

/**
 * The first syntax error of `text` as strict JSON (no comments, no trailing commas), or
 * undefined when there is none. Work and memory grow with the length of the text only; the call
 * stack does not grow with the nesting depth.
 */
export function firstJsonSyntaxError(text: string): JsonSyntaxError | undefined {
  const scanner = createScanner(text, false);
  const fail = (error: ParseErrorCode): JsonSyntaxError => ({
    offset: scanner.getTokenOffset(),
    error,
  });

  /** The next token that is not white space, or the error that the scanner met on the way. */
  function next(): SyntaxKind | JsonSyntaxError {
    for (;;) {
      const token = scanner.scan();
      const scanError = SCAN_ERRORS[scanner.getTokenError()];
      if (scanError !== undefined) return fail(scanError);
      switch (token) {
        case SyntaxKind.LineCommentTrivia:
        case SyntaxKind.BlockCommentTrivia:
          return fail(ParseErrorCode.InvalidCommentToken);
        case SyntaxKind.Unknown:
          return fail(ParseErrorCode.InvalidSymbol);
        case SyntaxKind.Trivia:
        case SyntaxKind.LineBreakTrivia:
          break;
        default:
          return token;
      }
    }
  }

  const open: OpenContainer[] = [];
  let token = next();
  if (typeof token !== "number") return token;
  if (token === SyntaxKind.EOF) return fail(ParseErrorCode.ValueExpected);

  // Each pass of the loop reads one value at `token`, then closes the containers that end after
  // it and moves to the next member (after its comma, and for an object after its name and
  // colon), or to the end of the text.
  for (;;) {
    // A value.
    if (token === SyntaxKind.OpenBracketToken || token === SyntaxKind.OpenBraceToken) {
      open.push({
        closer:
          token === SyntaxKind.OpenBracketToken
            ? SyntaxKind.CloseBracketToken
            : SyntaxKind.CloseBraceToken,
        needsComma: false,
      });
    } else if (token === SyntaxKind.NumericLiteral) {
      if (Number.isNaN(Number(scanner.getTokenValue())))
        return fail(ParseErrorCode.InvalidNumberFormat);
    } else if (
      token !== SyntaxKind.StringLiteral &&
      token !== SyntaxKind.NullKeyword &&
      token !== SyntaxKind.TrueKeyword &&
      token !== SyntaxKind.FalseKeyword
    ) {
      return fail(ParseErrorCode.ValueExpected);
    }
    token = next();
    if (typeof token !== "number") return token;

    // Close what ends here; stop at the next member's value.
    for (;;) {
      const container = open[open.length - 1];
      if (container === undefined) {
        return token === SyntaxKind.EOF ? undefined : fail(ParseErrorCode.EndOfFileExpected);
      }
      if (token === container.closer) {
        open.pop();
        const parent = open[open.length - 1];
        if (parent !== undefined) parent.needsComma = true;
        token = next();
        if (typeof token !== "number") return token;
        continue;
      }
      if (token === SyntaxKind.EOF) {
        return fail(
          container.closer === SyntaxKind.CloseBracketToken
            ? ParseErrorCode.CloseBracketExpected
            : ParseErrorCode.CloseBraceExpected,
        );
      }
      if (token === SyntaxKind.CommaToken) {
        if (!container.needsComma) return fail(ParseErrorCode.ValueExpected);
        token = next();
        if (typeof token !== "number") return token;
      } else if (container.needsComma) {
        return fail(ParseErrorCode.CommaExpected);
      }
      container.needsComma = true;
      if (container.closer === SyntaxKind.CloseBraceToken) {
        if (token !== SyntaxKind.StringLiteral) return fail(ParseErrorCode.PropertyNameExpected);
        token = next();
        if (typeof token !== "number") return token;
        if (token !== SyntaxKind.ColonToken) return fail(ParseErrorCode.ColonExpected);
        token = next();
        if (typeof token !== "number") return token;
      }
      break;
    }
  }
}
