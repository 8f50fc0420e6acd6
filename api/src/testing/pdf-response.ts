import { PDFParse } from 'pdf-parse';
import type request from 'supertest';

/** A supertest parser that collects a binary body (PDF, octet-stream) into a Buffer: `.buffer(true).parse(binaryBody)`. */
export function binaryBody(res: request.Response, callback: (err: Error | null, body: Buffer) => void): void {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => callback(null, Buffer.concat(chunks)));
}

/** The text of a PDF (pdf-parse), with runs of white space as one space since lines wrap anywhere, and its page count. */
export async function pdfText(body: Buffer): Promise<{ text: string; pages: number }> {
  const parser = new PDFParse({ data: new Uint8Array(body) });
  try {
    const result = await parser.getText();
    return { text: result.text.replace(/\s+/g, ' '), pages: result.total };
  } finally {
    await parser.destroy();
  }
}
