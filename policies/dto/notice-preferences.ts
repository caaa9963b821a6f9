import type { EmailedKind } from '../notice-kinds';

/** One kind of notice on a person's e-mail settings. */
export interface NoticePreferenceDto {
  kind: EmailedKind;
  label: string;
  /** Whether this person gets the e-mail copy (always true when fixed). */
  email: boolean;
  /** An emergency: always e-mailed, shown as fixed. */
  fixed: boolean;
}
