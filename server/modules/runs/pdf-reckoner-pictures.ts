import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import SVGtoPDF from 'svg-to-pdfkit';
import { ReckonerPlotSvg } from '../../../shared/plots/reckoner-plot-svg';
import { runPictures } from '../../../shared/plots/run-pictures';
import type { RunView } from '../../../shared/schemas/runs';

/**
 * The run's reckoner pictures at its measured mains (shared/plots/run-pictures.ts, as the page shows
 * them): each SVG drawn by svg-to-pdfkit at full width, with its caption, the way the readings plot is.
 */
export function drawRunPictures(
  doc: PDFKit.PDFDocument,
  run: RunView,
  at: {
    left: number;
    width: number;
    heading: (t: string) => void;
    ensure: (h: number) => void;
    text: (s: string) => string;
  },
) {
  for (const [i, model] of runPictures(run.snapshot, run.params.mainsVoltage).entries()) {
    const scale = at.width / model.width;
    const height = model.height * scale;
    at.ensure(height + 60); // the heading stays with its picture
    at.heading(model.title);
    const svg = at.text(
      renderToStaticMarkup(createElement(ReckonerPlotSvg, { model, id: `run-picture-${i}` })),
    );
    const top = doc.y;
    SVGtoPDF(doc, svg, at.left, top, {
      width: at.width,
      height,
      preserveAspectRatio: 'xMinYMin meet',
      fontCallback: (_family, bold) => (bold ? 'Helvetica-Bold' : 'Helvetica'),
    });
    doc.y = top + height + 4;
    doc.font('Helvetica').fontSize(8.5).text(at.text(model.caption), at.left, doc.y, { width: at.width });
  }
}
