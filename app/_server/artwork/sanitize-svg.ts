import "server-only";
import createDOMPurify from "dompurify";
import { JSDOM } from "jsdom";

export type SvgSanitizeReport = { svg: string; removed: { scripts: number; handlers: number; externalRefs: number; other: number } };

const window = new JSDOM("").window;
const purify = createDOMPurify(window as unknown as Parameters<typeof createDOMPurify>[0]);

/** Only same-document references (#id) and embedded raster data may stay. */
function isSafeReference(value: string): boolean {
  const v = value.trim().toLowerCase();
  return v.startsWith("#") || /^data:image\/(png|jpeg|webp|gif);base64,/.test(v);
}

function stripExternalUrls(css: string): { css: string; count: number } {
  let count = 0;
  const cleaned = css
    .replace(/@import[^;]*;?/gi, () => {
      count += 1;
      return "";
    })
    .replace(/url\(\s*(['"]?)(.*?)\1\s*\)/gi, (match, _q, target: string) => {
      if (isSafeReference(target)) return match;
      count += 1;
      return "none";
    });
  return { css: cleaned, count };
}

/**
 * Removes scripts, event handlers, foreign content and references to anything outside the file.
 * The result is what Chalkline stores and serves; the input is never served.
 */
export function sanitizeSvg(input: string): SvgSanitizeReport {
  const removed = { scripts: 0, handlers: 0, externalRefs: 0, other: 0 };
  purify.removeAllHooks();
  purify.addHook("uponSanitizeElement", (node, data) => {
    const tag = data.tagName?.toLowerCase();
    if (tag === "script") removed.scripts += 1;
    if (tag === "style" && node.textContent) {
      const { css, count } = stripExternalUrls(node.textContent);
      removed.externalRefs += count;
      node.textContent = css;
    }
  });
  purify.addHook("uponSanitizeAttribute", (_node, data) => {
    const name = data.attrName.toLowerCase();
    if (name.startsWith("on")) {
      removed.handlers += 1;
      data.keepAttr = false;
      return;
    }
    if ((name === "href" || name === "xlink:href" || name === "src") && !isSafeReference(data.attrValue)) {
      removed.externalRefs += 1;
      data.keepAttr = false;
      return;
    }
    if (name === "style") {
      const { css, count } = stripExternalUrls(data.attrValue);
      removed.externalRefs += count;
      data.attrValue = css;
    }
  });
  const svg = purify.sanitize(input, {
    USE_PROFILES: { svg: true, svgFilters: true },
    ADD_TAGS: ["use"],
    FORBID_TAGS: ["foreignObject", "iframe", "embed", "object", "audio", "video", "animate", "set", "animateMotion", "animateTransform"],
    WHOLE_DOCUMENT: false,
  }) as unknown as string;
  const dropped = purify.removed.length - removed.scripts - removed.handlers - removed.externalRefs;
  removed.other = Math.max(0, dropped);
  purify.removeAllHooks();
  return { svg, removed };
}
