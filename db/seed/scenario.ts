// The invented demo scenario. Every company, person and place here is fictional.
import type { Role } from "@/lib/auth/permissions";

export const demoPassword = "ordwise-demo-2026";

export const demoUsers: { email: string; name: string; role: Role }[] = [
  { email: "admin@ordwise.test", name: "Ines Marlowe", role: "admin" },
  { email: "engineer@ordwise.test", name: "Teodor Vance", role: "engineer" },
  { email: "technician@ordwise.test", name: "Priya Okonkwo-Hale", role: "technician" },
  { email: "viewer@ordwise.test", name: "Ruth Castellane (Quillbrook Cold Store Ltd)", role: "viewer" },
];

/** Display names of demo accounts in earlier versions of the scenario, renamed on the next start (e-mail → old name). */
export const renamedDemoUsers: Record<string, string> = {
  "viewer@ordwise.test": "Ruth Castellane (Feldmoor Grid Co-op)",
};

export const demoSites = [
  {
    name: "Quillbrook Cold Store — PCC 11 kV",
    address: "Unit 4, Quillbrook Trading Estate, Feldmoor",
    nominalVoltageV: 11000,
    frequencyHz: 50,
    iscA: 8200,
    ilA: 260,
    notes: "Six variable-speed compressor drives behind a 1.6 MVA transformer. Utility asked for IEEE 519 evidence after the 2026 extension.",
  },
  {
    name: "Harrowgate Water Pumping Station No. 3",
    address: "Old Mill Lane, Harrowgate Vale",
    nominalVoltageV: 480,
    frequencyHz: 60,
    iscA: 22000,
    ilA: 640,
    notes: "Two 250 kW pump drives, one with a new passive filter (before/after captures).",
  },
  {
    name: "Bench B — product compliance lab",
    address: "Ordwise demo lab, Tessaly Park",
    nominalVoltageV: 230,
    frequencyHz: 50,
    iscA: null,
    ilA: null,
    notes: "Single-phase equipment under test against IEC 61000-3-2 (reference source, 230 V 50 Hz).",
  },
];

/**
 * Customers own sites; a viewer reads only the approved sheets of their customers' sites.
 * The demo viewer (Quillbrook's facilities manager, who reads her company's approved sheets and forwards
 * them to the utility) belongs to Quillbrook only, so the Bench B and Harrowgate sheets stay hidden from her.
 */
export const demoCustomers: { name: string; siteNames: string[]; viewerEmails: string[] }[] = [
  { name: "Quillbrook Cold Store Ltd", siteNames: ["Quillbrook Cold Store — PCC 11 kV"], viewerEmails: ["viewer@ordwise.test"] },
  { name: "Harrowgate Vale Water Board", siteNames: ["Harrowgate Water Pumping Station No. 3"], viewerEmails: [] },
  { name: "Brannock Appliances Ltd", siteNames: ["Bench B — product compliance lab"], viewerEmails: [] },
];
