/**
 * The demo organisation, seeded on an empty database for the local run: Fernhollow Instruments
 * (invented), five accounts (an administrator, a systems engineer, a designer, a reviewer, and a
 * lead who designs in one project and reviews in another), five projects with specs in different states and
 * proposals through the workflow, and a small device library (invented NPN .model cards) in the
 * load-cell project. The seismic node's spec compares the PTAT tail (with its PNP) for a gain held
 * over a wide temperature range; the soil probe's is a PNP pair on a single 5 V supply, its input range
 * reaching the negative rail. Everything goes through the services, so the audit trail is real.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { DataSource } from 'typeorm';
import type { RuleSet } from '#shared/engine/types';
import type { AccountRole, ProjectRole } from '#shared/workflow/roles';
import { UserEntity } from '../entities/user.entity';
import { uploadDeviceModels } from '../services/devices.service';
import { addMember, createProject } from '../services/projects.service';
import { createProposal, decide, review } from '../services/proposals.service';
import { createSpec, updateSpec } from '../services/specs.service';
import { createUser, type PublicUser } from '../services/users.service';

export const DEMO_DOMAIN = 'demo.longtail.test';

type DemoKey = 'admin' | ProjectRole | 'lead';

/** The demo accounts: e-mail `<key>@demo.longtail.test`, the account's own role, and who they are. */
const DEMO_PEOPLE: { key: DemoKey; role: AccountRole; displayName: string }[] = [
  { key: 'admin', role: 'admin', displayName: 'Ines Okafor-Lind' },
  { key: 'requirements', role: 'member', displayName: 'Tomasz Rehn' },
  { key: 'designer', role: 'member', displayName: 'Priya Valcourt' },
  { key: 'reviewer', role: 'member', displayName: 'Samir Edelstein' },
  { key: 'lead', role: 'member', displayName: 'Wren Halloway-Ito' },
];

const demoDir = join(fileURLToPath(new URL('.', import.meta.url)), '..', 'demo');
const specsDir = join(demoDir, 'specs');
/** Invented NPN .model cards (FH2N22, FH2N24, FH2N26), uploaded into the load-cell project's library. */
export const DEMO_DEVICE_FILE = 'fernhollow-npn.lib';
const demoSpec = (file: string) => JSON.parse(readFileSync(join(specsDir, file), 'utf8')) as Record<string, unknown> & { title: string };

/** Seeds the demo when the database has no account yet. Returns false when it had one. */
export async function seedDemo(dataSource: DataSource, ruleSet: RuleSet, password: string): Promise<boolean> {
  if ((await dataSource.getRepository(UserEntity).count()) > 0) return false;
  const people = {} as Record<DemoKey, PublicUser>;
  for (const person of DEMO_PEOPLE) {
    people[person.key] = await createUser(dataSource, null, { email: `${person.key}@${DEMO_DOMAIN}`, displayName: person.displayName, role: person.role, password });
  }
  const admin = people.admin;
  /** A project with the systems engineer, the designer and the reviewer in their usual roles, and any others with the role they hold there. */
  const project = async (name: string, description: string, others: [DemoKey, ProjectRole][] = []) => {
    const created = await createProject(dataSource, admin.id, { name, description });
    for (const role of ['requirements', 'designer', 'reviewer'] as const) await addMember(dataSource, admin, created.id, people[role].id, role);
    for (const [key, role] of others) await addMember(dataSource, admin, created.id, people[key].id, role);
    return created;
  };

  // 1. Load-cell amplifier: rev A ranked, the spec revised (rev B, with its change note), rev B ranked
  // (closing the rev A ranking as superseded), decided and approved.
  const loadCell = await project('Kestrel load-cell amplifier', 'Bridge receiver for the 350 Ω load-cell family; differential output into the 24-bit converter.');
  const bridge = demoSpec('strain-bridge-receiver.json');
  const bridgeSpec = await createSpec(dataSource, people.requirements, loadCell.id, { title: bridge.title.replace('rev B', 'rev A'), payload: { ...bridge, cmrr: { ...(bridge.cmrr as object), marginDb: 3 } } });
  await createProposal(dataSource, people.requirements, bridgeSpec.id, ruleSet);
  await updateSpec(dataSource, people.requirements, bridgeSpec.id, { title: bridge.title, payload: bridge, note: 'Rejection margin raised from 3 dB to 6 dB after the rev A board picked up hum from the scale’s motor drive.' });
  // Its device library, uploaded by the systems engineer as the upload route does (checksum, audit events)
  await uploadDeviceModels(dataSource, people.requirements, loadCell.id, { originalName: DEMO_DEVICE_FILE, bytes: readFileSync(join(demoDir, 'devices', DEMO_DEVICE_FILE)) });
  const bridgeProposal = await createProposal(dataSource, people.designer, bridgeSpec.id, ruleSet);
  // Ranking rev B closed the rev A ranking as superseded. No option of rev B holds 42 V/V ±8 % from
  // −20 to 65 °C with a tail current flat in temperature, so the designer chooses with a reason.
  if (bridgeProposal.result.recommended) await decide(dataSource, people.designer, bridgeProposal.id, { kind: 'accept' }, ruleSet);
  else
    await decide(
      dataSource,
      people.designer,
      bridgeProposal.id,
      { kind: 'choose', topology: 'degenerated-mirror', reason: 'No option holds the gain over the full temperature range with this tail; the converter’s span calibration against the excitation takes the drift out, and the degenerated mirror keeps the rejection with room to spare.' },
      ruleSet,
    );
  await review(dataSource, people.reviewer, bridgeProposal.id, { verdict: 'approve', comment: 'Rejection margins hold at the hot corner; gain drift over temperature accepted on the strength of the span calibration (rev A bench notes).' });

  // 2. Studio interface: ranked, waiting for the designer.
  // Wren designs here and reviews on the biosignal front end: roles are per project.
  const studio = await project('Larkspur studio interface', 'Balanced line receiver ahead of the monitor path.', [['lead', 'designer']]);
  const line = demoSpec('studio-line-receiver.json');
  const lineSpec = await createSpec(dataSource, people.requirements, studio.id, { title: line.title, payload: line });
  await createProposal(dataSource, people.requirements, lineSpec.id, ruleSet);

  // 3. Biosignal front end: an override, returned by the reviewer for another look.
  const biosignal = await project('Marram biosignal front end', 'Electrode amplifier input pair of a patient-connected instrument; the bench prototype is never connected to a person, and its spec keeps the patient caution for the design that will be.', [['lead', 'reviewer']]);
  const electrode = demoSpec('electrode-amplifier-input.json');
  const electrodeSpec = await createSpec(dataSource, people.requirements, biosignal.id, { title: electrode.title, payload: electrode });
  const electrodeProposal = await createProposal(dataSource, people.designer, electrodeSpec.id, ruleSet);
  const degenerated = electrodeProposal.result.options.find((o) => o.topology === 'degenerated-mirror');
  if (degenerated?.design && degenerated.design.tail.topology === 'degenerated-mirror') {
    const design = { ...degenerated.design, tail: { ...degenerated.design.tail, emitterResistanceOhm: degenerated.design.tail.emitterResistanceOhm * 2 } };
    await decide(dataSource, people.designer, electrodeProposal.id, { kind: 'override', design, reason: 'Stock on hand: doubling the emitter resistors of the degenerated mirror instead of adding the Wilson’s third transistor.' }, ruleSet);
    await review(dataSource, people.reviewer, electrodeProposal.id, { verdict: 'return', comment: 'Check the rejection at the low end of the input range with the doubled emitter resistors before we commit.' });
  }

  // 4. Seismic node: a gain held to ±2 % from −40 to 85 °C, ranked and waiting for the designer. The
  // spec lists the PTAT (constant-gm) tail with its PNP: the tail current rises with absolute
  // temperature, so gm, and the resistor-loaded gain, hold where a flat tail current lets it drift.
  const seismic = await project('Harrier seismic node', 'Geophone receiver of an outdoor seismic node; the sealed enclosure sees −40 to 85 °C and the gain is calibrated once, at the factory.');
  const geophone = demoSpec('seismic-node-receiver.json');
  const geophoneSpec = await createSpec(dataSource, people.requirements, seismic.id, { title: geophone.title, payload: geophone });
  await createProposal(dataSource, people.designer, geophoneSpec.id, ruleSet);

  // 5. Soil probe: a PNP pair on a single 5 V supply, ranked and waiting for the designer. The
  // sensor's output sits a few millivolts above ground, so the pair hangs from a tail at +5 V and
  // its input range reaches 0 V, where an NPN pair's would stop a VBE and a tail's headroom above it.
  const soil = await project('Sandpiper soil probe', 'Ground-referenced input of a buried soil-moisture probe, powered from a single 5 V rail; the sensor bridge sits a few millivolts above 0 V.');
  const soilInput = demoSpec('soil-probe-input.json');
  const soilSpec = await createSpec(dataSource, people.requirements, soil.id, { title: soilInput.title, payload: soilInput });
  await createProposal(dataSource, people.designer, soilSpec.id, ruleSet);
  return true;
}

/** Production: the first administrator from the environment, on an empty database. */
export async function seedFirstAdmin(dataSource: DataSource, admin: { email: string; password: string }): Promise<boolean> {
  if ((await dataSource.getRepository(UserEntity).count()) > 0) return false;
  await createUser(dataSource, null, { email: admin.email, displayName: 'Administrator', role: 'admin', password: admin.password });
  return true;
}
