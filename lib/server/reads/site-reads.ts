import "server-only";
import { listDrawings } from "../drawings";
import { listRecordPhotos } from "../record-photos";
import type { RecordPhotoListQuery } from "@/lib/schemas/record-photo";
import type { DrawingListQuery } from "@/lib/schemas/drawing";
import type { Db } from "@/db/client";
import type { ArtefactClass, Context, Trench } from "@/db/schema";
import { listClasses } from "../artefact-classes";
import { listAudit } from "../audit-read";
import { contextClassNotes, signedOffClassNotes } from "../class-history";
import { contextSummaries, getContext, listContexts } from "../contexts";
import { drawSiteMatrix } from "../export/matrix-image";
import { getFind } from "../finds";
import { countHumanRemains, listHumanRemains } from "../human-remains";
import type { SiteActor } from "../membership";
import { listPhotos } from "../photos";
import { listPlanFinds } from "../plan-finds";
import { listSignOffQueue, sheetProblems } from "../sign-off";
import { listMembers, listMySites, siteOverview } from "../sites";
import { getTrench, listTrenches } from "../trenches";
import { contextSpotLevels } from "../level-runs";
import { drawTrenchSections, listSections, sectionFinds, trenchContextLevels } from "../sections";
import { listSpits } from "../spits";
import { listTrenchSquares } from "../squares";
import { listSamples, readSample } from "../samples";
import { labelItems, resolveLabel } from "../labels";
import { boxChoices, listBoxes, readBox } from "../boxes";
import { moveTargets } from "../finds-bulk";
import type { BoxListQuery } from "@/lib/schemas/processing";
import type { LabelRef } from "@/lib/labels/code";
import type { LabelSelection } from "@/lib/schemas/labels";
import type { SampleListQuery } from "@/lib/schemas/sample";
import { trenchDepth } from "../trench-depth";
import { patternsChoices } from "./patterns-choices";
import { loadLevelBook } from "./level-book";
import { loadTrenchReport } from "./trench-report";
import { userNames } from "./user-names";
import { accountNumbers } from "../number-accounting";
import type { NumberKind } from "@/db/schema";
import {
  printedContextRegister,
  printedFindsRegister,
  printedLevelBook,
  printedSamplesRegister,
} from "./printed-registers";

/**
 * The reads a site's pages make, bound to the database and to the one site whose membership was checked
 * (pageSiteActor). Pages get these functions, never the database handle: they cannot query, write, or
 * read another site.
 */
export function siteReads(db: Db, actor: SiteActor) {
  const siteId = actor.site.id;
  return {
    overview: () => siteOverview(db, actor),
    members: () => listMembers(db, siteId),
    trenches: () => listTrenches(db, siteId),
    trench: (trenchId: string) => getTrench(db, siteId, trenchId),
    contexts: (trenchId?: string) => listContexts(db, siteId, trenchId),
    contextSummaries: (trenchId?: string) => contextSummaries(db, siteId, trenchId),
    context: (contextId: string) => getContext(db, siteId, contextId),
    sheetProblems: (context: Context) => sheetProblems(db, context),
    signOffQueue: () => listSignOffQueue(db, siteId),
    matrix: (trenchId?: string) => drawSiteMatrix(db, siteId, trenchId),
    classes: () => listClasses(db, siteId),
    contextClassNotes: (context: Context) => contextClassNotes(db, context),
    classesAsSignedOff: (signedOffAt: Date, classes: ArtefactClass[]) =>
      signedOffClassNotes(db, siteId, signedOffAt, classes),
    find: (findId: string) => getFind(db, siteId, findId),
    planFinds: (trenchId: string) => listPlanFinds(db, siteId, trenchId),
    photos: (trenchId: string) => listPhotos(db, siteId, trenchId),
    humanRemains: (trenchId?: string) => countHumanRemains(db, siteId, trenchId),
    humanRemainsFinds: (trenchId?: string) => listHumanRemains(db, siteId, trenchId),
    audit: (filter: Parameters<typeof listAudit>[2]) => listAudit(db, siteId, filter),
    trenchReport: (trench: Trench) => loadTrenchReport(db, trench),
    patternsChoices: () => patternsChoices(db, siteId),
    userNames: (ids: (string | null | undefined)[]) => userNames(db, ids),
    spits: (contextId: string) => listSpits(db, siteId, contextId),
    contextSpotLevels: (contextId: string) => contextSpotLevels(db, siteId, contextId),
    trenchDepth: (trenchId: string) => trenchDepth(db, siteId, trenchId),
    trenchSquares: (trenchId: string) => listTrenchSquares(db, siteId, trenchId),
    levelBook: () => loadLevelBook(db, siteId),
    sections: (trenchId: string) => listSections(db, siteId, trenchId),
    sectionFinds: (trenchId: string) => sectionFinds(db, siteId, trenchId),
    trenchContextLevels: (trenchId: string) => trenchContextLevels(db, siteId, trenchId),
    trenchSections: (trench: Trench) => drawTrenchSections(db, actor.site, trench),
    samples: (q: SampleListQuery) => listSamples(db, siteId, q),
    sample: (sampleId: string) => readSample(db, siteId, sampleId),
    drawings: (q: DrawingListQuery) => listDrawings(db, siteId, q),
    recordPhotos: (q: RecordPhotoListQuery) => listRecordPhotos(db, siteId, q),
    labels: (q: LabelSelection) => labelItems(db, actor.site, q),
    boxes: (q: BoxListQuery) => listBoxes(db, siteId, q),
    boxChoices: () => boxChoices(db, siteId),
    findMoveTargets: () => moveTargets(db, siteId),
    box: (boxId: string) => readBox(db, siteId, boxId),
    numberAccounting: (kind: NumberKind) => accountNumbers(db, siteId, kind),
    printed: {
      contexts: () => printedContextRegister(db, siteId),
      finds: () => printedFindsRegister(db, siteId),
      samples: () => printedSamplesRegister(db, siteId),
      levelBook: () => printedLevelBook(db, siteId),
    },
  };
}

export type SiteReads = ReturnType<typeof siteReads>;

/** The reads of the signed-in person's own pages, outside any one site. */
export function userReads(db: Db, userId: string) {
  return { mySites: () => listMySites(db, userId), resolveLabel: (ref: LabelRef) => resolveLabel(db, userId, ref) };
}
