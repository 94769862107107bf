import { z } from 'zod';
import { fail, ok, type Result } from '../core/result.ts';

/** The fixed name of the description file at a dataset's root. */
export const DESCRIPTION_FILE = 'hairline.json';

/** Where one role's files are, relative to the dataset root, and how their frame keys are found. */
export interface FolderSpec {
  folder: string;
  /** The suffix group to use when the folder holds several encodings of each frame (`"_gt_class"`, `""` for none). */
  suffix?: string;
  /** A regular expression over the path without extension whose first group is the frame key. */
  pattern?: string;
}

/** A dataset description (README "Your data"): what the guess cannot know. Paths are relative to the root. */
export interface Description {
  truth: FolderSpec;
  images?: FolderSpec;
  /** Run name → its folder. */
  predictions?: Record<string, FolderSpec>;
  confidence?: Record<string, FolderSpec>;
  /** Instance maps (16-bit instance ids, 0 = no instance), for instance-weighted IoU. */
  instances?: FolderSpec;
  /** The class table file. */
  classes?: string;
  /** A list file of the frames to use (one key per line, `#` comments). */
  list?: string;
}

const pathSchema = z
  .string({ error: 'expected a path relative to the dataset root' })
  .refine((p) => !p.startsWith('/') && !/^[A-Za-z]:/.test(p) && !p.split(/[\\/]/).includes('..'), {
    error: 'must be a path inside the dataset root (no leading /, no ..)',
  });

const folderSchema = z.preprocess(
  (v) => (typeof v === 'string' ? { folder: v } : v),
  z
    .object(
      {
        folder: pathSchema,
        suffix: z.string({ error: 'expected the suffix as a string ("" for none)' }).optional(),
        pattern: z
          .string({ error: 'expected a regular expression as a string' })
          .refine((p) => regexOk(p), { error: 'is not a regular expression with a group for the frame key, like "^(.+)_gt$"' })
          .optional(),
      },
      { error: (iss) => (iss.code === 'invalid_type' ? 'expected a folder path, or { "folder", "suffix", "pattern" }' : undefined) },
    )
    .strict(),
);

const runsSchema = z.record(z.string().min(1), folderSchema, {
  error: (iss) => (iss.code === 'invalid_type' ? 'expected an object from run name to folder' : undefined),
});

const descriptionSchema = z
  .object(
    {
      truth: folderSchema,
      images: folderSchema.optional(),
      predictions: runsSchema.optional(),
      confidence: runsSchema.optional(),
      instances: folderSchema.optional(),
      classes: pathSchema.optional(),
      list: pathSchema.optional(),
    },
    { error: (iss) => (iss.code === 'invalid_type' ? 'expected a JSON object with at least "truth"' : undefined) },
  )
  .strict();

function regexOk(p: string): boolean {
  try {
    return new RegExp(`${p}|`).exec('')!.length > 1;
  } catch {
    return false;
  }
}

/** Returns the validated description from the text of hairline.json, or a one-line error naming the key and the problem. */
export function descriptionFromText(text: string, file = DESCRIPTION_FILE): Result<Description> {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    return fail(file, `is not valid JSON (${(e as Error).message})`);
  }
  const r = descriptionSchema.safeParse(json);
  if (r.success) return ok(r.data as Description);
  const issue = r.error.issues[0];
  const key = issue.path.map(String).join('.');
  return fail(file, key ? `"${key}": ${issue.message}` : issue.message);
}
