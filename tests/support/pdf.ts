import { extractText, getDocumentProxy } from 'unpdf';
import type { Client } from './api';

/** Has supertest collect a binary answer (a PDF) into a Buffer at `res.body`. */
export const binaryBody = (req: ReturnType<Client['get']>) =>
  req.buffer(true).parse((res, done) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => done(null, Buffer.concat(chunks)));
  });

/** A PDF's text as unpdf (pdf.js) extracts it, runs of white space made single spaces. */
export async function pdfText(bytes: Buffer): Promise<{ text: string; pages: number }> {
  const doc = await getDocumentProxy(new Uint8Array(bytes));
  const { text, totalPages } = await extractText(doc, { mergePages: true });
  return { text: text.replace(/\s+/g, ' '), pages: totalPages };
}
