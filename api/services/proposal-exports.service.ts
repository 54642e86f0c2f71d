/**
 * What a proposal is exported as: a SPICE netlist of an option or of the decided design, its
 * ranking as CSV, and the whole record as JSON (the proposal, its verification, measurements,
 * comment threads and audit trail). Composed here from the services that own each part; the routes only send them.
 */
import type { DataSource } from 'typeorm';
import { ESTIMATE_NOTICE } from '#shared/engine/index';
import { spiceNetlist } from '#shared/engine/netlist';
import type { Design } from '#shared/engine/types';
import type { NetlistQuery } from '#shared/api/proposals';
import { rankingCsv } from '#shared/export/ranking-csv';
import { currentDesignName } from '#shared/workflow/current-design';
import { invalid } from '../errors';
import { designCard } from './devices.service';
import { allMeasurements } from './measurements.service';
import { getProposal, proposalAudit } from './proposals.service';
import type { PublicUser } from './users.service';
import { verificationStatus } from './verification.service';
import { listComments } from './comments.service';

type Viewer = Pick<PublicUser, 'id' | 'role'>;

/**
 * A SPICE netlist (ngspice-ready .cir) of one ranked option, or of the latest decision's design
 * (an override included), with the differential or common-mode AC drive, from the product's one
 * netlist writer. The header says where it comes from and that the figures are estimates.
 */
export async function proposalNetlist(dataSource: DataSource, viewer: Viewer, proposalId: number, query: NetlistQuery) {
  const proposal = await getProposal(dataSource, viewer, proposalId);
  let design: Design | null | undefined;
  let label: string;
  if (query.source === 'decision') {
    // The decided design exactly as verified and signed off (shared/workflow/current-design.ts).
    const current = proposal.currentDesign;
    if (!current || current.basis !== 'decision') throw invalid([{ path: '?source', message: 'this proposal has no decision yet' }]);
    design = current.design;
    if (!design) throw invalid([{ path: '?source', message: 'the decided design could not be sized' }]);
    label = `${proposal.status === 'approved' ? 'signed-off' : 'decided'} design, ${currentDesignName(current)} (decision #${current.decisionId}, ${current.decisionKind})`;
  } else {
    const topology = query.topology ?? proposal.result.recommended ?? proposal.result.options[0]?.topology;
    design = proposal.result.options.find((o) => o.topology === topology)?.design;
    if (!design) throw invalid([{ path: '?topology', message: `is not a sized option of this proposal: ${String(topology)}` }]);
    label = `ranked option ${topology}`;
  }
  const card = await designCard(dataSource, proposal.projectId, proposal.specVersion.payload, design.device);
  // User text (the spec's title, the card's name and text) goes in as header comments only: the writer keeps each on comment lines.
  const header = [
    `Exported by Longtail: proposal #${proposal.id}, ${label}`,
    `spec "${proposal.specVersion.title}" version ${proposal.specVersion.version}, engine ${proposal.engineVersion}, rule set ${proposal.rulesetVersion.slice(0, 12)}`,
    `at ${design.temperatureC ?? 27} °C, input common mode ${design.inputCommonModeV ?? 0} V (nominal conditions)`,
    ESTIMATE_NOTICE,
    ...card.comments,
  ];
  const analysis = query.drive === 'differential' ? 'ac-differential' : 'ac-common-mode';
  const text = spiceNetlist(design, { analysis, ...NETLIST_SWEEP, spiceOnlyParameters: card.spiceOnlyParameters }, header);
  return { fileName: `longtail-${proposal.id}-${design.tail.topology}-${query.drive}.cir`, text };
}

/** The AC sweep written into exported netlists: 1 Hz to 1 GHz, 20 points a decade (the band where the
 * engine's rejection curve and frequency figures are held to ngspice; the devices' own capacitances act
 * there). */
const NETLIST_SWEEP = { startHz: 1, stopHz: 1e9, pointsPerDecade: 20 };

/** The proposal's ranking as CSV, with its file name. */
export async function proposalRankingCsv(dataSource: DataSource, viewer: Viewer, proposalId: number) {
  const proposal = await getProposal(dataSource, viewer, proposalId);
  return { fileName: `longtail-ranking-${proposal.id}.csv`, text: rankingCsv(proposal.result) };
}

/** The whole record of a proposal as one JSON document, with its file name. */
export async function proposalExport(dataSource: DataSource, viewer: Viewer, proposalId: number) {
  const [proposal, audit, verification, measurements, comments] = await Promise.all([
    getProposal(dataSource, viewer, proposalId),
    proposalAudit(dataSource, viewer, proposalId),
    verificationStatus(dataSource, viewer, proposalId),
    allMeasurements(dataSource, viewer, proposalId),
    listComments(dataSource, viewer, proposalId),
  ]);
  return {
    fileName: `longtail-proposal-${proposal.id}.json`,
    document: { exportedAt: new Date().toISOString(), notice: ESTIMATE_NOTICE, proposal, verification, measurements, comments, audit },
  };
}
