import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { appRoot as printAppRoot } from '../app-root';

// The print families and their files in fonts/ (TTF; see fonts/README.md for licences).
export const PRINT_FONTS = {
  serif: 'Source Serif 4',
  sans: 'IBM Plex Sans',
} as const;

const FILES: { family: string; dir: string; faces: { file: string; fontWeight: number; fontStyle: 'normal' | 'italic' }[] }[] = [
  {
    family: PRINT_FONTS.serif,
    dir: 'source-serif-4',
    faces: [
      { file: 'SourceSerif4_400Regular.ttf', fontWeight: 400, fontStyle: 'normal' },
      { file: 'SourceSerif4_400Regular_Italic.ttf', fontWeight: 400, fontStyle: 'italic' },
      { file: 'SourceSerif4_600SemiBold.ttf', fontWeight: 600, fontStyle: 'normal' },
      { file: 'SourceSerif4_700Bold.ttf', fontWeight: 700, fontStyle: 'normal' },
    ],
  },
  {
    family: PRINT_FONTS.sans,
    dir: 'ibm-plex-sans',
    faces: [
      { file: 'IBMPlexSans_400Regular.ttf', fontWeight: 400, fontStyle: 'normal' },
      { file: 'IBMPlexSans_400Regular_Italic.ttf', fontWeight: 400, fontStyle: 'italic' },
      { file: 'IBMPlexSans_600SemiBold.ttf', fontWeight: 600, fontStyle: 'normal' },
      { file: 'IBMPlexSans_700Bold.ttf', fontWeight: 700, fontStyle: 'normal' },
    ],
  },
];

type FontApi = {
  register: (opts: { family: string; fonts: { src: string; fontWeight: number; fontStyle: 'normal' | 'italic' }[] }) => void;
  registerHyphenationCallback: (cb: (word: string) => string[]) => void;
};

let registered: string[] | undefined;

/** Registers the print families once per process (Font.register is global). */
export function registerPrintFonts(Font: FontApi): string[] {
  if (registered) return registered;
  const root = printAppRoot();
  const families: string[] = [];
  for (const f of FILES) {
    const fonts = f.faces.map((face) => {
      const src = join(root, 'fonts', f.dir, face.file);
      if (!existsSync(src)) throw new Error(`print font missing: fonts/${f.dir}/${face.file} (looked under ${root})`);
      return { src, fontWeight: face.fontWeight, fontStyle: face.fontStyle };
    });
    Font.register({ family: f.family, fonts });
    families.push(f.family);
  }
  // Words are never split: puzzle text must read exactly as the editor wrote it.
  Font.registerHyphenationCallback((word) => [word]);
  registered = families;
  return families;
}
