// screenProfile on a table (bench document version 2): the radial pattern behind an aperture on one path, seen on the
// screen that path's light reaches, computed by the rail screenProfile on the unfolded bench of that path (table-unfold.ts).
// Sources: those of screenProfile (paraxial Fresnel diffraction integral, Born & Wolf §8.8; Collins 1970) along the unfolded length.
import type { BenchDocument } from "@/lib/bench/schema";
import type { BenchDocumentV2, TableElement } from "@/lib/bench/schema-v2";
import { OpticsInputError } from "./analyze";
import { screenProfile, type ProfileOptions, type ScreenProfile } from "./profile";
import type { TableAnalysis } from "./table";
import { chainId, unfoldPath, type UnfoldablePath } from "./table-unfold";

/**
 * The straight (version 1) bench that the light through `apertureId` follows to one screen of a table: the unfolded chain
 * of the path that ends on that screen, with the chain's ids of the aperture and the screen. With several entries for the
 * aperture (a split sends its light to several screens), `pathId` and `screenId` choose one; otherwise the first entry
 * that has a screen. Throws OpticsInputError with a sentence when the aperture is not lit or has no screen.
 */
export function tableScreenChain(
  doc: BenchDocumentV2,
  analysis: TableAnalysis,
  apertureId: string,
  options: { pathId?: string; screenId?: string } = {},
): { doc: BenchDocument; chainApertureId: string; chainScreenId: string; pathId: string; screenId: string } {
  const entries = analysis.apertures.filter((a) => a.id === apertureId && (options.pathId === undefined || a.pathId === options.pathId) && (options.screenId === undefined || a.screenId === options.screenId));
  if (entries.length === 0) throw new OpticsInputError("aperture-not-reached", `No light reaches an aperture "${apertureId}"${options.pathId ? ` on beam ${options.pathId}` : ""}, so there is no pattern to compute.`);
  const entry = entries.find((a) => a.screenId !== null);
  if (!entry || entry.screenId === null) throw new OpticsInputError("aperture-without-screen", `The light through aperture "${apertureId}" reaches no screen, so there is no pattern to compute.`);
  const screenId = entry.screenId;
  const pathsById = new Map<string, UnfoldablePath>(analysis.paths.map((p) => [p.id, p]));
  const childrenOf = new Map<string, string[]>();
  for (const p of analysis.paths) if (p.parentPathId) childrenOf.set(p.parentPathId, [...(childrenOf.get(p.parentPathId) ?? []), p.id]);
  // the path (this one or below it) that ends on the screen
  const below = [entry.pathId];
  let leafId: string | null = null;
  while (below.length && leafId === null) {
    const id = below.shift() as string;
    const p = analysis.paths.find((x) => x.id === id);
    if (p && p.elementIds.includes(screenId)) leafId = id;
    below.push(...(childrenOf.get(id) ?? []));
  }
  if (leafId === null) throw new OpticsInputError("aperture-without-screen", `The screen "${screenId}" could not be followed from aperture "${apertureId}".`);
  const byId = new Map<string, TableElement>(doc.elements.map((e) => [e.id, e]));
  const chain = unfoldPath(doc, byId, pathsById, leafId);
  return { doc: chain.doc, chainApertureId: chainId(entry.pathId, apertureId), chainScreenId: chainId(leafId, screenId), pathId: entry.pathId, screenId };
}

/**
 * The profile behind `apertureId` on a table. With several entries for the aperture (a split sends its light to several
 * screens), `pathId` and `screenId` choose one; otherwise the first entry that has a screen. Throws OpticsInputError
 * with a sentence when the aperture is not lit or has no screen.
 */
export function tableScreenProfile(
  doc: BenchDocumentV2,
  analysis: TableAnalysis,
  apertureId: string,
  options: ProfileOptions & { pathId?: string; screenId?: string } = {},
): ScreenProfile & { pathId: string; screenId: string } {
  const chain = tableScreenChain(doc, analysis, apertureId, { pathId: options.pathId, screenId: options.screenId });
  const profile = screenProfile(chain.doc, chain.chainApertureId, options);
  return { ...profile, pathId: chain.pathId, screenId: chain.screenId };
}
