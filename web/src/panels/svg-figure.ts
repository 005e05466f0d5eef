/**
 * A drawing of the review sheet's SVG renderer as an element of this page. The text is parsed as
 * an SVG document (never as HTML markup) and its root imported, so nothing in it can run: the
 * renderer escapes every text it writes (names from the scenario included), and a document that
 * does not parse is refused rather than shown half.
 */
const SVG_NS = 'http://www.w3.org/2000/svg';

export function svgFigure(svgText: string, label: string): SVGSVGElement {
  const parsed = new DOMParser().parseFromString(svgText, 'image/svg+xml');
  const root = parsed.documentElement;
  if (root.namespaceURI !== SVG_NS || root.localName !== 'svg' || parsed.getElementsByTagNameNS('*', 'parsererror').length > 0) {
    throw new Error('the drawing could not be read as SVG');
  }
  const svg = document.importNode(root, true) as unknown as SVGSVGElement;
  // The drawing scales to the panel's width; its viewBox keeps the proportions.
  svg.removeAttribute('width');
  svg.removeAttribute('height');
  svg.setAttribute('role', 'img');
  svg.setAttribute('aria-label', label);
  return svg;
}
