import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { SessionUser } from '../../../shared/contracts/auth';
import { pressStandardInfo, type PressSettings, type PressSpecInput, type PressSpecResponse } from '../../../shared/contracts/press';
import { templatePressDefaults } from '../../../shared/contracts/templates';
import type { DbOrTx } from '../../platform/db/client';
import type { PlatformDeps } from '../../platform/deps';
import { Unprocessable } from '../../platform/http/errors';
import { getPageTemplate, type EditionDocument, type OutputProfile, type RenderOptions } from '../print/index';
import { outputProfile, publication } from './publication-schema';
import { getPublicationRow } from './publications';

// A publication's press spec: its own choices over the template's defaults (standard,
// output condition, bleed, smallest type, thinnest line) and, for PDF/X-4, the plant's ICC
// output profile. Every edition document carries the settings in force when it is loaded, so
// a proof and its press file print with the same spec.

type PubRow = ReturnType<typeof getPublicationRow>;

function specOf(p: PubRow): PressSpecInput {
  return {
    standard: p.pressStandard,
    condition: (p.pressCondition as PressSpecInput['condition']) ?? null,
    bleedMm: p.pressBleedMm,
    minTypePt: p.pressMinTypePt,
    minLinePt: p.pressMinLinePt,
  };
}

function defaultsOf(p: PubRow) {
  const t = getPageTemplate(p.templateId);
  if (!t) throw new Unprocessable(`The publication's page template "${p.templateId}" is not installed.`);
  return templatePressDefaults(t);
}

/** The press settings in force for a publication (its choices over its template's defaults). */
export function pressSettingsFor(p: PubRow): PressSettings {
  const d = defaultsOf(p);
  const s = specOf(p);
  return {
    standard: s.standard ?? d.standard,
    condition: s.condition ?? d.condition,
    bleedMm: s.bleedMm ?? d.bleedMm,
    minTypePt: s.minTypePt ?? d.minTypePt,
    minLinePt: s.minLinePt ?? d.minLinePt,
    profileSha256: p.outputProfileSha256,
  };
}

function profileInfo(db: DbOrTx, sha: string | null): PressSpecResponse['profile'] {
  if (!sha) return null;
  const r = db.select({ sha256: outputProfile.sha256, description: outputProfile.description, icc: outputProfile.icc, uploadedAt: outputProfile.uploadedAt }).from(outputProfile).where(eq(outputProfile.sha256, sha)).get();
  return r ? { sha256: r.sha256, description: r.description, bytes: r.icc.length, uploadedAt: r.uploadedAt.toISOString() } : null;
}

export function getPressSpec(db: DbOrTx, publicationId: string): PressSpecResponse {
  const p = getPublicationRow(db, publicationId);
  return { spec: specOf(p), effective: pressSettingsFor(p), templateDefaults: defaultsOf(p), profile: profileInfo(db, p.outputProfileSha256) };
}

function requireProfileFor(standard: PressSettings['standard'], sha: string | null) {
  if (pressStandardInfo[standard].needsProfile && !sha) {
    throw new Unprocessable(`${pressStandardInfo[standard].gtsVersion} embeds the plant's ICC output profile: upload it first.`, [{ path: 'body.standard', message: 'upload the output profile before choosing PDF/X-4' }]);
  }
}

export function updatePressSpec(deps: Pick<PlatformDeps, 'db' | 'clock'>, publicationId: string, input: PressSpecInput): PressSpecResponse {
  deps.db.transaction((tx) => {
    const p = getPublicationRow(tx, publicationId);
    requireProfileFor(input.standard ?? defaultsOf(p).standard, p.outputProfileSha256);
    tx.update(publication)
      .set({ pressStandard: input.standard, pressCondition: input.condition, pressBleedMm: input.bleedMm, pressMinTypePt: input.minTypePt, pressMinLinePt: input.minLinePt, updatedAt: deps.clock.now() })
      .where(eq(publication.id, publicationId))
      .run();
  });
  return getPressSpec(deps.db, publicationId);
}

/**
 * Reads what a PDF/X output intent needs from an ICC profile (ICC.1 header, 7.2; tag table,
 * 7.3): an output ('prtr') profile of CMYK data, its size as declared, and its description
 * ('desc' of version 2, or 'mluc' of version 4). Throws 422 naming what is wrong.
 */
export function readIccProfile(icc: Buffer): { description: string } {
  const bad = (message: string) => new Unprocessable(`This is not a CMYK output profile: ${message}.`, [{ path: 'file', message }]);
  if (icc.length < 132) throw bad('too short for an ICC profile (132 bytes of header and tag count)');
  if (icc.toString('latin1', 36, 40) !== 'acsp') throw bad('no ICC signature "acsp" at byte 36');
  if (icc.readUInt32BE(0) !== icc.length) throw bad(`the header declares ${icc.readUInt32BE(0)} bytes, the file has ${icc.length}`);
  const cls = icc.toString('latin1', 12, 16);
  if (cls !== 'prtr') throw bad(`its class is "${cls}", not an output ("prtr") profile`);
  const space = icc.toString('latin1', 16, 20);
  if (space !== 'CMYK') throw bad(`its data colour space is "${space.trim()}", not CMYK`);
  const count = icc.readUInt32BE(128);
  let description = '';
  for (let i = 0; i < Math.min(count, 200); i++) {
    const e = 132 + i * 12;
    if (e + 12 > icc.length) break;
    if (icc.toString('latin1', e, e + 4) !== 'desc') continue;
    const off = icc.readUInt32BE(e + 4);
    const type = icc.toString('latin1', off, off + 4);
    if (type === 'desc') {
      const n = icc.readUInt32BE(off + 8);
      description = icc.toString('latin1', off + 12, off + 12 + n).replace(/\0+$/, '');
    } else if (type === 'mluc' && icc.readUInt32BE(off + 8) > 0) {
      const len = icc.readUInt32BE(off + 20);
      const at = off + icc.readUInt32BE(off + 24);
      const u16 = icc.subarray(at, at + len);
      description = Array.from({ length: len / 2 }, (_, k) => String.fromCharCode(u16.readUInt16BE(k * 2))).join('');
    }
  }
  return { description: description.trim() || 'ICC output profile' };
}

/** Stores a plant's profile (by SHA-256) and makes it the publication's (admin). */
export function uploadOutputProfile(deps: Pick<PlatformDeps, 'db' | 'clock'>, who: SessionUser, publicationId: string, icc: Buffer): PressSpecResponse {
  const { description } = readIccProfile(icc);
  const sha256 = createHash('sha256').update(icc).digest('hex');
  deps.db.transaction((tx) => {
    getPublicationRow(tx, publicationId);
    const now = deps.clock.now();
    tx.insert(outputProfile).values({ sha256, description, icc, uploadedBy: who.id, uploadedAt: now }).onConflictDoNothing().run();
    tx.update(publication).set({ outputProfileSha256: sha256, updatedAt: now }).where(eq(publication.id, publicationId)).run();
  });
  return getPressSpec(deps.db, publicationId);
}

/**
 * The render options for an edition document: the output profile its press settings name
 * (PDF/X-4) joins the given options. Every render of an edition goes through here.
 */
export function renderOptionsFor(db: DbOrTx, doc: EditionDocument, opts: RenderOptions): RenderOptions {
  const profile = outputProfileFor(db, doc.press?.profileSha256 ?? null);
  return profile ? { ...opts, outputProfile: profile } : opts;
}

/** A stored output profile as the renderer takes it (base64), or undefined for none. */
export function outputProfileFor(db: DbOrTx, sha: string | null): OutputProfile | undefined {
  if (!sha) return undefined;
  const r = db.select({ description: outputProfile.description, icc: outputProfile.icc }).from(outputProfile).where(eq(outputProfile.sha256, sha)).get();
  if (!r) throw new Unprocessable(`The output profile ${sha.slice(0, 12)}... named by the press spec is not stored.`);
  return { base64: r.icc.toString('base64'), description: r.description };
}
