import QRCode from 'qrcode';

/**
 * A QR code of a join link as an SVG document (the `qrcode` package; error correction M, which
 * survives a scuffed printout; a 4-module quiet zone as the QR standard asks).
 */
export async function joinQrSvg(url: string): Promise<string> {
  return QRCode.toString(url, { type: 'svg', errorCorrectionLevel: 'M', margin: 4 });
}
