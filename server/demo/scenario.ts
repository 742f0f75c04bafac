/** The invented Larkspur Materials Lab. Nothing here is real data. */
import { DEMO_ARGON_MODEL } from './demo-trajectories.ts';

export const DEMO_ACCOUNTS = [
  {
    role: 'admin (data steward)', siteRole: 'admin' as const, displayName: 'Mira Okonkwo-Hale',
    email: 'steward@larkspur-lab.example', password: 'larkspur-steward-2026',
  },
  {
    role: 'member (graduate student)', siteRole: 'member' as const, displayName: 'Tobias Vennard',
    email: 'tobias@larkspur-lab.example', password: 'larkspur-student-2026',
  },
];

export const DEMO_PROJECTS = [
  {
    name: 'Noble-liquid benchmark',
    description: 'Argon-like Lennard-Jones runs at a low, a middle and a high temperature: a solid, a liquid and a hot liquid.',
    /** Shared by the project's runs: the energy analysis uses it. */
    interactionModel: DEMO_ARGON_MODEL,
  },
  {
    name: 'Small-molecule vibrations',
    description: 'A box of harmonic diatomics, for sharp VDOS peaks.',
  },
];

/** State-point series of the lab: runs of one system compared across temperature. */
export const DEMO_SERIES = [
  {
    project: 'Noble-liquid benchmark',
    name: 'Argon-like melting: 40, 90 and 130 K',
    files: ['argon-like-40K-solid.extxyz', 'argon-like-90K-liquid.extxyz', 'argon-like-130K-hot-liquid.extxyz'],
  },
];
