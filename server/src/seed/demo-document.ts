import { createHash, randomUUID } from 'node:crypto';
import { Readable } from 'node:stream';
import PDFDocument from 'pdfkit';
import type { EntityManager } from 'typeorm';
import { CaseDocument } from '../entities';
import type { ObjectStorage } from '../storage';

/** A one-page invented referral note, made here so the demo ships no binary files. */
export async function demoReferralPdf(athleteName: string, date: string): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: 64, bottom: 64, left: 64, right: 64 },
    info: { Title: 'Referral note (demo)' },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));
  doc.font('Helvetica-Bold').fontSize(16).text('Bayside Sports Medicine Clinic (invented, demo only)');
  doc.moveDown().font('Helvetica').fontSize(11).text(`Date: ${date}`);
  doc.text(`Re: ${athleteName}`);
  doc
    .moveDown()
    .text(
      'Referral note — DEMO DOCUMENT. Every name and finding on this page is invented for the Loadline demo; it describes no real person.',
    );
  doc
    .moveDown()
    .text('Seen after an inversion injury of the right ankle. Please progress loading as symptoms allow and review in one week.');
  doc.end();
  return done;
}

/** Stores the demo referral on the case through the same storage the app uses. */
export async function attachDemoDocument(
  m: EntityManager,
  storage: ObjectStorage,
  input: {
    organizationId: string;
    athleteId: string;
    caseId: string;
    athleteName: string;
    date: string;
    uploadedByUserId: string;
    uploadedByName: string;
  },
): Promise<void> {
  const bytes = await demoReferralPdf(input.athleteName, input.date);
  const key = `${input.organizationId}/documents/${randomUUID()}`;
  await storage.put(key, Readable.from(bytes), { size: bytes.length, contentType: 'application/pdf' });
  try {
    await m.save(
      m.create(CaseDocument, {
        organizationId: input.organizationId,
        athleteId: input.athleteId,
        caseId: input.caseId,
        title: 'Referral note (demo)',
        documentDate: input.date,
        issuedBy: 'Bayside Sports Medicine Clinic (invented)',
        mediaType: 'application/pdf',
        sizeBytes: String(bytes.length),
        sha256: createHash('sha256').update(bytes).digest('hex'),
        storageKey: key,
        uploadedByUserId: input.uploadedByUserId,
        uploadedByName: input.uploadedByName,
      }),
    );
  } catch (error) {
    await storage.delete(key);
    throw error;
  }
}
