/**
 * Images a moderator sends back with a returned write-up ("image 2 shows a number
 * plate"). They travel inside the decision's note, so the e-mail, the audit log and My
 * documents show them with no change; the editor reads them back out to mark each image.
 */
import { z } from 'zod';
import { uploadIdSchema } from '../schemas/writeup';

export const MAX_IMAGE_NOTE = 500;
export const MAX_IMAGE_NOTES = 20;

export const imageNoteSchema = z.strictObject({
  /** 1-based place of the image in the write-up. */
  image: z.number().int().min(1).max(99),
  uploadId: uploadIdSchema.optional(),
  note: z
    .string({ error: 'must be text' })
    .trim()
    .min(1, { error: 'cannot be empty: say what is wrong with the image' })
    .max(MAX_IMAGE_NOTE, { error: `must be at most ${MAX_IMAGE_NOTE} characters` }),
});
export const imageNotesSchema = z
  .array(imageNoteSchema)
  .max(MAX_IMAGE_NOTES, { error: `may hold at most ${MAX_IMAGE_NOTES} image notes` });

export type ImageNote = z.infer<typeof imageNoteSchema>;

const HEADING = 'Images sent back:';
const LINE = /^- Image (\d{1,2}): (.+)$/;

/** The decision note with the image notes appended as lines "- Image N: …". */
export function composeReturnNote(note: string, imageNotes: readonly ImageNote[] = []): string {
  const text = note.trim();
  if (!imageNotes.length) return text;
  const lines = [...imageNotes]
    .sort((a, b) => a.image - b.image)
    .map((n) => `- Image ${n.image}: ${n.note.replace(/\s+/g, ' ').trim()}`);
  return [text, `${HEADING}\n${lines.join('\n')}`].filter(Boolean).join('\n\n');
}

/** The image notes in a decision note (none when it has no "Images sent back:" part). */
export function parseImageNotes(
  note: string | null | undefined,
): Array<{ image: number; note: string }> {
  if (!note) return [];
  const at = note.lastIndexOf(HEADING);
  if (at < 0) return [];
  const out: Array<{ image: number; note: string }> = [];
  for (const line of note.slice(at + HEADING.length).split('\n')) {
    const m = LINE.exec(line.trim());
    if (m) out.push({ image: Number(m[1]), note: m[2] });
  }
  return out;
}
