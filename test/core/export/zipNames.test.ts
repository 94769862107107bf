// What a safe entry name is follows the ZIP format's rules (PKWARE APPNOTE.TXT 6.3, §4.4.17: a relative
// path with forward slashes, no drive letter or leading slash) plus the "zip slip" class of attacks
// (entries with `..` that climb out of the target folder) and Windows' refused characters and device
// names (Microsoft, "Naming Files, Paths, and Namespaces").
import { describe, expect, it } from 'vitest';
import { zipNamePart, zipNamesUnique, zipPathIsSafe } from '../../../src/core/export/zipNames.ts';

const NASTY = [
  '../../etc/passwd', '..', '.', '...', '/abs/path', 'C:\\Windows\\system32', 'a\\..\\b', 'frame\u0000name', 'tab\there',
  'line\nbreak', '\u202egnp.exe', 'CON', 'nul.png', 'com1', ' spaced out ', '.hidden', 'trailing.', 'dir/sub/frame',
  'ünïcödé/名前', '', '   ', '😀'.repeat(100), 'a:b*c?d"e<f>g|h', '\u007f\u0085', '..\\..\\x', '....//....//',
];

describe('zipNamePart: one safe path part from any name', () => {
  it('never leaves a separator, a backslash, a control or bidi character, or "..", and is never empty', () => {
    for (const n of NASTY) {
      const s = zipNamePart(n);
      expect(s, n).not.toMatch(/[\\/\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/);
      expect(s, n).not.toContain('..');
      expect(s.length, n).toBeGreaterThan(0);
      expect(s, n).not.toMatch(/^[.\s]|[.\s]$/);
      expect([...s].length, n).toBeLessThanOrEqual(80);
      expect(zipPathIsSafe(`tiles/${s}/truth.png`), n).toBe(true);
    }
  });

  it('keeps ordinary names readable', () => {
    expect(zipNamePart('kq-0001')).toBe('kq-0001');
    expect(zipNamePart('dir/sub/frame')).toBe('dir_sub_frame');
    expect(zipNamePart('ünïcödé/名前')).toBe('ünïcödé_名前');
    expect(zipNamePart('../../etc/passwd')).toBe('etc_passwd');
    expect(zipNamePart('a  b\t\tc')).toBe('a_b_c');
    expect(zipNamePart('CON')).toBe('_CON');
    expect(zipNamePart('')).toBe('_');
  });

  it('unique names differ case-insensitively', () => {
    const u = zipNamesUnique();
    expect(['a', 'A', 'a', 'b', 'a-2'].map(u)).toEqual(['a', 'A-2', 'a-3', 'b', 'a-2-2']);
  });

  it('zipPathIsSafe refuses climbing, absolute and odd paths', () => {
    for (const bad of ['../x', '/x', 'a/../b', 'a//b', 'a\\b', 'a/./b', 'C:/x', '', 'a/b\u0000']) expect(zipPathIsSafe(bad), bad).toBe(false);
    expect(zipPathIsSafe('tiles/kq-0001_ab12/truth.png')).toBe(true);
  });
});
