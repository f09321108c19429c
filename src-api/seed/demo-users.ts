/** Demo accounts and suppliers of the invented Harrowgate Drive Systems scenario. */
export const DEMO_PASSWORD = 'yokeline-demo';

export const DEMO_SUPPLIERS = [
  { code: 'NGL', name: 'Northgate Lamination Ltd', domain: 'northgate-lamination.test' },
  { code: 'SPW', name: 'Selby Pressworks', domain: 'selby-pressworks.test' },
  { code: 'OKS', name: 'Okaro Stamping Co.', domain: 'okaro-stamping.test' },
] as const;

export const DEMO_USERS = [
  { email: 'inspector@harrowgate.test', name: 'Ines Varga', role: 'inspector' },
  { email: 'engineer@harrowgate.test', name: 'Tomas Reyes', role: 'engineer' },
  { email: 'auditor@harrowgate.test', name: 'Aud Halvorsen', role: 'auditor' },
  { email: 'admin@harrowgate.test', name: 'Pat Okafor', role: 'admin' },
  { email: 'quality@northgate-lamination.test', name: 'Mara Lind', role: 'supplier', supplier: 'NGL' },
  { email: 'quality@selby-pressworks.test', name: 'Dev Sandhu', role: 'supplier', supplier: 'SPW' },
  { email: 'quality@okaro-stamping.test', name: 'Kenji Okaro', role: 'supplier', supplier: 'OKS' },
] as const;
