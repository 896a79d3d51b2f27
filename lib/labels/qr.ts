import QRCode from "qrcode";

/**
 * A QR code as one SVG path over a square of `size` modules (plus the 4-module quiet zone the standard asks
 * for), drawn by the qrcode package's encoder. Medium error correction survives a scuffed bag label.
 */
export function qrPath(text: string): { size: number; d: string } {
  const qr = QRCode.create(text, { errorCorrectionLevel: "M" });
  const n = qr.modules.size;
  const quiet = 4;
  let d = "";
  for (let y = 0; y < n; y++) {
    for (let x = 0; x < n; x++) {
      if (qr.modules.get(y, x)) d += `M${x + quiet} ${y + quiet}h1v1h-1z`;
    }
  }
  return { size: n + 2 * quiet, d };
}
