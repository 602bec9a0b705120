/**
 * The review page lets a moderator send single images back with a note. The page
 * provides this; the write-up view, wherever it finds it, shows a note field per image.
 */
import type { InjectionKey, Ref } from 'vue';

export interface ReviewImageNotes {
  /** Notes by 1-based image number. */
  notes: Ref<Record<number, string>>;
  /** False while the moderator may not decide (own submission, claimed by another). */
  enabled: Ref<boolean>;
}

export const REVIEW_IMAGE_NOTES: InjectionKey<ReviewImageNotes> = Symbol('review-image-notes');
