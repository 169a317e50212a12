import QRCode from 'qrcode';

/** Draws a QR code as filled squares (vector, sharp at any zoom) with its quiet zone left white. */
export function drawQr(doc: PDFKit.PDFDocument, text: string, x: number, y: number, size: number): void {
  const { modules } = QRCode.create(text, { errorCorrectionLevel: 'M' });
  const quiet = 4;
  const cell = size / (modules.size + quiet * 2);
  doc.save().fillColor('#ffffff').rect(x, y, size, size).fill().fillColor('#000000');
  for (let row = 0; row < modules.size; row++) {
    for (let col = 0; col < modules.size; col++) {
      if (modules.get(row, col)) doc.rect(x + (col + quiet) * cell, y + (row + quiet) * cell, cell, cell);
    }
  }
  doc.fill().restore();
}
