import { registerStdFonts } from 'pdfkit';
import Courier from 'pdfkit/standard-fonts/Courier';
import Helvetica from 'pdfkit/standard-fonts/Helvetica';
import HelveticaBold from 'pdfkit/standard-fonts/HelveticaBold';
import HelveticaBoldOblique from 'pdfkit/standard-fonts/HelveticaBoldOblique';
import HelveticaOblique from 'pdfkit/standard-fonts/HelveticaOblique';

/**
 * The review sheet (src/report/sheet/) measures and writes text in the standard PDF fonts. In Node,
 * pdfkit reads their metrics from its own files; its browser build cannot read files, so the page
 * hands it the metrics it needs (bundled, nothing fetched). Imported for this side effect, before
 * any sheet is built.
 */
registerStdFonts(Helvetica, HelveticaBold, HelveticaOblique, HelveticaBoldOblique, Courier);
