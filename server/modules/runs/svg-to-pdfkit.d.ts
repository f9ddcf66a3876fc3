// svg-to-pdfkit ships no types: the part of its API the run-sheet PDF uses.
declare module 'svg-to-pdfkit' {
  interface SvgToPdfOptions {
    width?: number;
    height?: number;
    preserveAspectRatio?: string;
    assumePt?: boolean;
    /** Names the PDF font for an SVG font-family (a font the document has, or a built-in one). */
    fontCallback?: (family: string, bold: boolean, italic: boolean) => string;
    warningCallback?: (warning: string) => void;
  }
  export default function SVGtoPDF(
    doc: PDFKit.PDFDocument,
    svg: string,
    x: number,
    y: number,
    options?: SvgToPdfOptions,
  ): void;
}
