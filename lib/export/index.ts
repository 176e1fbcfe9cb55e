export { renderCHeader } from "./c-header";
export { DIFFERENCE_EQUATION, SIGN_CONVENTION } from "./describe";
export { renderJson } from "./json";
export { floatLiteral, pythonFloat, wordLiteral } from "./literals";
export { commentSafe, exportName, identifierStem } from "./names";
export { assertFirmwareSafe, coefficientContent, contentHash, prepareExport } from "./prepare";
export { renderExport } from "./render";
export { renderScipy } from "./scipy";
export * from "./types";
