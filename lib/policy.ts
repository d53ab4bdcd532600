// The access policy: for every operation of the app, which roles may use it and which rows each of
// them reaches. This table is the only place where that is decided. Route handlers, server actions
// and pages all get their check from it (lib/server/operation.ts), the navigation is derived from
// it, and tests/e2e/api/access-matrix.test.ts walks every row of it.
//
// Rows are always of the user's own company. Within the company:
//   company    — every row;
//   supervised — the user's own rows and those of the company's apprentices (a technician signs off
//                an apprentice's finding);
//   own        — only the user's own rows (an apprentice's own service calls).
// A role that is not listed is refused with 403 whatever it asks for; a row outside the reach of a
// listed role is answered 404, the same as a row that does not exist, so "not yours" never tells
// anything about other people's records. Trainers work on practice scenarios: they see no real calls.
import type { Role } from '@/lib/roles';

export type Reach = 'company' | 'supervised' | 'own';

export type Access =
  /** Anyone, signed in or not (sign-in, health). */
  { public: true } | { public?: false; roles: Partial<Record<Role, Reach>> };

const everyone = { apprentice: 'company', technician: 'company', lead: 'company', trainer: 'company', admin: 'company' } as const;
const field = { apprentice: 'company', technician: 'company', lead: 'company', admin: 'company' } as const;
/** Service calls and what hangs off them (diagnoses, repair, sign-off). */
const callWork = { apprentice: 'own', technician: 'supervised', lead: 'company', admin: 'company' } as const;
const callSupervisors = { technician: 'supervised', lead: 'company', admin: 'company' } as const;
const adminOnly = { admin: 'company' } as const;
/** Who dispatches: reassigns calls and reopens closed ones. */
const dispatchers = { lead: 'company', admin: 'company' } as const;

export const POLICY = {
  'auth.signIn': { public: true },
  'auth.signOut': { public: true },
  'auth.signOutEverywhere': { roles: everyone },
  'health.get': { public: true },
  'me.get': { roles: everyone },

  'company.get': { roles: everyone },
  'company.update': { roles: adminOnly },
  'users.list': { roles: adminOnly },
  'users.create': { roles: adminOnly },
  'users.update': { roles: adminOnly },

  // Apprentices pick a site and unit when they open a call, but the history of a unit (every visit,
  // every reading, by anyone) is for technicians and up.
  'sites.list': { roles: field },
  'sites.create': { roles: field },
  'units.list': { roles: field },
  'units.create': { roles: field },
  'units.get': { roles: { technician: 'company', lead: 'company', admin: 'company' } },
  // Correcting the unit record (found wrong at the unit): technicians and up; an apprentice asks one.
  'units.correct': { roles: { technician: 'company', lead: 'company', admin: 'company' } },

  'calls.list': { roles: callWork },
  'calls.create': { roles: callWork },
  'calls.get': { roles: callWork },
  'calls.recordRepair': { roles: callWork },
  'calls.close': { roles: callSupervisors },
  'calls.reopen': { roles: dispatchers },
  'calls.assign': { roles: dispatchers },

  'diagnoses.start': { roles: callWork },
  'diagnoses.get': { roles: callWork },
  'diagnoses.answer': { roles: callWork },
  'diagnoses.undo': { roles: callWork },
  'diagnoses.signOff': { roles: callSupervisors },
  // "None of these fits": whoever walks the diagnosis may hand it to the leads.
  'diagnoses.escalate': { roles: callWork },
  // The escalations waiting for a lead (the home page of leads and admins).
  'diagnoses.escalations': { roles: dispatchers },

  'trees.list': { roles: everyone },
  'treeVersions.get': { roles: everyone },

  // ── Tree authoring: drafts, review, publishing, diff, import and export ──
  // Leads and admins write (h8s). Everyone signed in reads published versions (treeVersions.get
  // answers 404 for a draft to anyone else); drafts, reviews, diffs and exports are for leads and admins.
  // Approval is by a different lead or an admin than the one who wrote the version (lib/server/trees.ts).
  'trees.authoring': { roles: dispatchers },
  'trees.get': { roles: dispatchers },
  'trees.create': { roles: dispatchers },
  'trees.startDraft': { roles: dispatchers },
  'trees.import': { roles: dispatchers },
  'treeVersions.authoring': { roles: dispatchers },
  'treeVersions.save': { roles: dispatchers },
  'treeVersions.submit': { roles: dispatchers },
  'treeVersions.approve': { roles: dispatchers },
  'treeVersions.return': { roles: dispatchers },
  'treeVersions.publish': { roles: dispatchers },
  'treeVersions.validation': { roles: dispatchers },
  'treeVersions.diff': { roles: dispatchers },
  'treeVersions.export': { roles: dispatchers },
  // The isolation check: every fault of the bench's library through a version, before publishing.
  'treeVersions.isolationCheck': { roles: dispatchers },
  // Usage: how diagnoses went on each version, and the company's findings, first-time fix and time to a finding.
  'trees.usage': { roles: dispatchers },
  'trees.companyUsage': { roles: dispatchers },

  // ── Training: the bench, practice scenarios, attempts and the isolation check ──
  // Practice (h9ui): trainers create and assign scenarios; apprentices see and run only their own
  // assignments and attempts; leads and admins read everything of the company's practice.
  'practice.overview': { roles: { trainer: 'company', lead: 'company', admin: 'company' } },
  'practice.scenarios.create': { roles: { trainer: 'company' } },
  'practice.scenarios.get': { roles: { trainer: 'company', lead: 'company', admin: 'company' } },
  'practice.scenarios.assign': { roles: { trainer: 'company' } },
  'practice.assignments.list': { roles: { apprentice: 'own', trainer: 'company', lead: 'company', admin: 'company' } },
  'practice.attempts.start': { roles: { apprentice: 'own' } },
  'practice.attempts.get': { roles: { apprentice: 'own', trainer: 'company', lead: 'company', admin: 'company' } },
  'practice.attempts.finish': { roles: { apprentice: 'own' } },
  // The walk of an attempt in the wizard: only its apprentice answers (and undoes) its steps.
  'practice.attempts.answer': { roles: { apprentice: 'own' } },
  'practice.attempts.undo': { roles: { apprentice: 'own' } },
  'practice.progress': { roles: { trainer: 'company', lead: 'company', admin: 'company' } },
  // The bench of a running attempt: only its apprentice works it (the score is read from what it stores).
  'practice.bench.get': { roles: { apprentice: 'own' } },
  'practice.bench.act': { roles: { apprentice: 'own' } },
  'practice.bench.measure': { roles: { apprentice: 'own' } },
  'practice.bench.observe': { roles: { apprentice: 'own' } },
  // The bench itself (h9core): anyone signed in practises on sessions of their own; another user's
  // session is not found. Which fault a session runs is told only to trainers, leads and admins.
  'bench.sessions.create': { roles: { apprentice: 'own', technician: 'own', lead: 'own', trainer: 'own', admin: 'own' } },
  'bench.sessions.get': { roles: { apprentice: 'own', technician: 'own', lead: 'own', trainer: 'own', admin: 'own' } },
  'bench.sessions.act': { roles: { apprentice: 'own', technician: 'own', lead: 'own', trainer: 'own', admin: 'own' } },
  'bench.sessions.measure': { roles: { apprentice: 'own', technician: 'own', lead: 'own', trainer: 'own', admin: 'own' } },
  'bench.sessions.observe': { roles: { apprentice: 'own', technician: 'own', lead: 'own', trainer: 'own', admin: 'own' } },
  'bench.faults': { roles: everyone },

  // ── Photos, the report as PDF, and e-mail ──
  // Photos (h10a): whoever may see the call, with the call's reach, adds, sees and (while the call is open) removes its photos.
  'attachments.upload': { roles: callWork },
  'attachments.list': { roles: callWork },
  'attachments.get': { roles: callWork },
  'attachments.delete': { roles: callWork },
  // The report as PDF: whoever may see the call (customer copy by default, ?version=office).
  'reports.pdf': { roles: callWork },
  // E-mailing the report is a technician's job and up: an apprentice's report goes out once a technician has it.
  'reports.emailPreview': { roles: callSupervisors },
  'reports.email': { roles: callSupervisors },
  'mail.resend': { roles: callSupervisors },
  // What the local SMTP sink caught (development and tests; empty with a real mail server).
  'mail.mailbox': { roles: adminOnly },
  // Each user's own e-mail notification settings.
  'notifications.get': { roles: everyone },
  'notifications.update': { roles: everyone },
} as const satisfies Record<string, Access>;

export type OperationName = keyof typeof POLICY;
export const OPERATION_NAMES = Object.keys(POLICY) as OperationName[];

export function accessOf(name: OperationName): Access {
  return POLICY[name];
}

/** How far `role` reaches for `name`, or null when the role may not use it at all. */
export function reachOf(name: OperationName, role: Role): Reach | null {
  const access: Access = POLICY[name];
  if (access.public) return 'company';
  return access.roles[role] ?? null;
}

/** Roles that may use the operation (every role for a public one). */
export function rolesFor(name: OperationName): Role[] {
  const access: Access = POLICY[name];
  const all: Role[] = ['apprentice', 'technician', 'lead', 'trainer', 'admin'];
  return access.public ? all : all.filter((role) => access.roles[role] !== undefined);
}

export function may(role: Role, name: OperationName): boolean {
  return reachOf(name, role) !== null;
}

/**
 * The rows one operation may touch for one user: always one company, and within it the reach the
 * policy gives the user's role. Every query of `db/` that reads or changes rows a user may not
 * reach takes one of these, never the user's role.
 */
export interface Scope {
  companyId: string;
  userId: string;
  reach: Reach;
}

/**
 * Who may open each page of the navigation: the operation whose records the page shows, or, for a
 * page that shows none yet, its roles. The navigation and the pages' own checks both read this.
 */
export const PAGE_ACCESS = {
  '/calls': 'calls.list',
  '/units': 'units.get',
  '/trees': { roles: ['lead', 'admin'] },
  // Apprentices run their assignments, trainers make them; leads and admins read the results and
  // prove a tree on a bench session of their own (a fault of their choice).
  '/practice': { roles: ['apprentice', 'trainer', 'lead', 'admin'] },
  '/admin/users': 'users.list',
  '/admin/company': 'company.update',
} as const satisfies Record<string, OperationName | { roles: readonly Role[] }>;

export type PagePath = keyof typeof PAGE_ACCESS;

export function mayOpen(role: Role, page: PagePath): boolean {
  const access: OperationName | { roles: readonly Role[] } = PAGE_ACCESS[page];
  return typeof access === 'string' ? may(role, access) : access.roles.includes(role);
}
