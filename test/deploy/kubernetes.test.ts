/**
 * The Kubernetes manifests under deploy/kubernetes/, validated offline:
 * 1. against the Kubernetes API's own schemas, with the validators that the kubernetes-models
 *    package (npm) compiles from the Kubernetes OpenAPI definitions: required fields, types,
 *    enums and formats;
 * 2. strictly, for unknown fields (a misspelt `readinessProbe` is not an error to a JSON
 *    schema without additionalProperties, but the API server's strict field validation refuses
 *    it): each manifest is type-checked by the TypeScript compiler as an object literal of the
 *    package's declared type, and excess property checks name any field the API does not have;
 * 3. against what this service needs: probes on /healthz and /readyz, a security context that
 *    runs as non-root on a read-only root filesystem with every capability dropped, resource
 *    requests and limits, a grace period longer than drain plus shutdown, the HPA on CPU, a PDB,
 *    and a Service without session affinity.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import ts from 'typescript';
import { parseAllDocuments } from 'yaml';
import { describe, expect, it } from 'vitest';
import { Deployment } from 'kubernetes-models/apps/v1/Deployment';
import { Service } from 'kubernetes-models/v1/Service';
import { HorizontalPodAutoscaler } from 'kubernetes-models/autoscaling/v2/HorizontalPodAutoscaler';
import { PodDisruptionBudget } from 'kubernetes-models/policy/v1/PodDisruptionBudget';
import { CONFIG_DEFAULTS, loadConfig } from '../../src/config.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const DIR = join(ROOT, 'deploy', 'kubernetes');

interface Manifest {
  file: string;
  doc: Record<string, unknown> & { apiVersion: string; kind: string; metadata: { name: string } };
}

const MANIFESTS: Manifest[] = readdirSync(DIR)
  .filter((f) => f.endsWith('.yaml') || f.endsWith('.yml'))
  .sort()
  .flatMap((file) =>
    parseAllDocuments(readFileSync(join(DIR, file), 'utf8')).map((d) => {
      expect(d.errors, file).toEqual([]);
      return { file, doc: d.toJSON() as Manifest['doc'] };
    }),
  );

/** The model class (its validator) and the declaration of its type, per apiVersion and kind. */
const KINDS: Record<string, { model: new (data: never) => { validate(): void }; module: string; type: string }> = {
  'apps/v1 Deployment': { model: Deployment as never, module: 'kubernetes-models/apps/v1/Deployment', type: 'IDeployment' },
  'v1 Service': { model: Service as never, module: 'kubernetes-models/v1/Service', type: 'IService' },
  'autoscaling/v2 HorizontalPodAutoscaler': { model: HorizontalPodAutoscaler as never, module: 'kubernetes-models/autoscaling/v2/HorizontalPodAutoscaler', type: 'IHorizontalPodAutoscaler' },
  'policy/v1 PodDisruptionBudget': { model: PodDisruptionBudget as never, module: 'kubernetes-models/policy/v1/PodDisruptionBudget', type: 'IPodDisruptionBudget' },
};

const byKind = (kind: string) => MANIFESTS.filter((m) => m.doc.kind === kind).map((m) => m.doc);

/** Type-checks manifests as literals of their declared types; returns the compiler's messages. */
function typeCheck(manifests: Manifest[]): string[] {
  const virtual = join(DIR, '__manifests__.ts');
  const lines: string[] = [];
  manifests.forEach((m, i) => {
    const k = KINDS[`${m.doc.apiVersion} ${m.doc.kind}`]!;
    lines.push(`import type { ${k.type} as T${i} } from '${k.module}';`);
  });
  manifests.forEach((m, i) => lines.push(`export const m${i}: T${i} = ${JSON.stringify(m.doc, null, 2)};`));
  const source = lines.join('\n');
  const options: ts.CompilerOptions = { module: ts.ModuleKind.CommonJS, moduleResolution: ts.ModuleResolutionKind.Node10, target: ts.ScriptTarget.ES2022, strict: true, noEmit: true, skipLibCheck: true, types: [] };
  const host = ts.createCompilerHost(options);
  const getSourceFile = host.getSourceFile.bind(host);
  host.getSourceFile = (name, lang, ...rest) => (name === virtual ? ts.createSourceFile(name, source, lang) : getSourceFile(name, lang, ...rest));
  const fileExists = host.fileExists.bind(host);
  host.fileExists = (name) => name === virtual || fileExists(name);
  const program = ts.createProgram([virtual], options, host);
  return ts.getPreEmitDiagnostics(program).map((d) => {
    const where = d.file && d.start !== undefined ? d.file.getLineAndCharacterOfPosition(d.start) : undefined;
    const text = ts.flattenDiagnosticMessageText(d.messageText, '\n');
    return where ? `${d.file!.fileName === virtual ? 'manifest' : d.file!.fileName}:${where.line + 1}: ${text}` : text;
  });
}

describe('manifests validate against the Kubernetes schemas', () => {
  it('holds a Deployment, a Service, a HorizontalPodAutoscaler and a PodDisruptionBudget, each of a known kind', () => {
    expect(MANIFESTS.map((m) => m.doc.kind).sort()).toEqual(['Deployment', 'HorizontalPodAutoscaler', 'PodDisruptionBudget', 'Service']);
    for (const m of MANIFESTS) expect(KINDS[`${m.doc.apiVersion} ${m.doc.kind}`], `${m.file}: ${m.doc.apiVersion} ${m.doc.kind}`).toBeDefined();
  });

  for (const m of MANIFESTS) {
    it(`${m.file}: ${m.doc.kind} passes the API schema`, () => {
      const { model } = KINDS[`${m.doc.apiVersion} ${m.doc.kind}`]!;
      expect(() => new model(m.doc as never).validate()).not.toThrow();
    });
  }

  it('every field is one the API knows (strict), with the right type', () => {
    expect(typeCheck(MANIFESTS)).toEqual([]);
  });

  it('the checks can fail: a wrong type, a missing field and a misspelt field are caught', () => {
    const dep = structuredClone(byKind('Deployment')[0]!) as unknown as { spec: { replicas: unknown; template: { spec: Record<string, unknown> } } };
    dep.spec.replicas = 'two';
    expect(() => new Deployment(dep as never).validate()).toThrow();
    const noSelector = structuredClone(byKind('Deployment')[0]!) as unknown as { spec: Record<string, unknown> };
    delete noSelector.spec.selector;
    expect(() => new Deployment(noSelector as never).validate()).toThrow();
    const misspelt = structuredClone(byKind('Deployment')[0]!) as unknown as { spec: { template: { spec: { containers: Array<Record<string, unknown>> } } } };
    const c = misspelt.spec.template.spec.containers[0]!;
    c.readinesProbe = c.readinessProbe;
    const messages = typeCheck([{ file: 'mutated', doc: misspelt as never }]);
    expect(messages.join('\n')).toMatch(/readinesProbe/);
  });
});

describe('what the service needs from its deployment', () => {
  const dep = byKind('Deployment')[0] as unknown as {
    metadata: { name: string };
    spec: {
      selector: { matchLabels: Record<string, string> };
      template: {
        metadata: { labels: Record<string, string> };
        spec: {
          terminationGracePeriodSeconds: number;
          automountServiceAccountToken: boolean;
          securityContext: { runAsNonRoot: boolean; runAsUser: number; seccompProfile: { type: string } };
          containers: Array<{
            name: string;
            ports: Array<{ name: string; containerPort: number }>;
            env: Array<{ name: string; value?: string; valueFrom?: { secretKeyRef?: { name: string; key: string; optional?: boolean } } }>;
            resources: { requests: Record<string, string>; limits: Record<string, string> };
            securityContext: { allowPrivilegeEscalation: boolean; readOnlyRootFilesystem: boolean; runAsNonRoot: boolean; privileged: boolean; capabilities: { drop: string[] } };
            livenessProbe: { httpGet: { path: string; port: string | number } };
            readinessProbe: { httpGet: { path: string; port: string | number }; periodSeconds: number };
            startupProbe?: { httpGet: { path: string } };
            lifecycle?: unknown;
          }>;
        };
      };
    };
  };
  const pod = dep.spec.template.spec;
  const c = pod.containers[0]!;
  const env = Object.fromEntries(c.env.filter((e) => e.value !== undefined).map((e) => [e.name, e.value!]));

  it('probes: liveness on /healthz, readiness on /readyz, on the container port', () => {
    expect(c.livenessProbe.httpGet.path).toBe('/healthz');
    expect(c.readinessProbe.httpGet.path).toBe('/readyz');
    expect(c.startupProbe?.httpGet.path).toBe('/healthz');
    const port = c.ports.find((p) => p.name === c.readinessProbe.httpGet.port || p.containerPort === c.readinessProbe.httpGet.port);
    expect(port?.containerPort).toBe(Number(env.PORT));
    expect(env.HOST).toBe('0.0.0.0');
  });

  it('security context: non-root, read-only root filesystem, no privilege escalation, every capability dropped', () => {
    expect(pod.securityContext.runAsNonRoot).toBe(true);
    expect(pod.securityContext.runAsUser).toBeGreaterThan(0);
    expect(pod.securityContext.seccompProfile.type).toBe('RuntimeDefault');
    expect(pod.automountServiceAccountToken).toBe(false);
    expect(c.securityContext).toMatchObject({ allowPrivilegeEscalation: false, readOnlyRootFilesystem: true, runAsNonRoot: true, privileged: false });
    expect(c.securityContext.capabilities.drop).toEqual(['ALL']);
  });

  it('resources: CPU and memory requested and limited (the HPA needs the CPU request)', () => {
    for (const r of ['cpu', 'memory']) {
      expect(c.resources.requests[r], `requests.${r}`).toBeDefined();
      expect(c.resources.limits[r], `limits.${r}`).toBeDefined();
    }
  });

  it('the settings in the manifest are valid for the service, and the grace period outlasts drain plus shutdown', () => {
    const config = loadConfig(env);
    expect(config.HOST).toBe('0.0.0.0');
    const boundS = (config.DRAIN_DELAY_MS + config.SHUTDOWN_TIMEOUT_MS) / 1000;
    expect(pod.terminationGracePeriodSeconds).toBeGreaterThan(boundS);
    // The drain delay is in the service, so no preStop sleep is needed (the image need not have one).
    expect(c.lifecycle).toBeUndefined();
    expect(config.DRAIN_DELAY_MS).toBeGreaterThanOrEqual(CONFIG_DEFAULTS.DRAIN_DELAY_MS);
  });

  it('API keys come from a Secret, as hashes, optional', () => {
    const keys = c.env.find((e) => e.name === 'API_KEY_HASHES');
    expect(keys?.value).toBeUndefined();
    expect(keys?.valueFrom?.secretKeyRef).toMatchObject({ key: 'API_KEY_HASHES', optional: true });
  });

  it('the selector matches the pod labels, and the Service, HPA and PDB point at the same pods', () => {
    const labels = dep.spec.template.metadata.labels;
    for (const [k, v] of Object.entries(dep.spec.selector.matchLabels)) expect(labels[k]).toBe(v);
    const svc = byKind('Service')[0] as unknown as { spec: { selector: Record<string, string>; sessionAffinity?: string; ports: Array<{ targetPort: string | number }> } };
    for (const [k, v] of Object.entries(svc.spec.selector)) expect(labels[k]).toBe(v);
    expect(svc.spec.sessionAffinity ?? 'None').toBe('None');
    expect(c.ports.some((p) => p.name === svc.spec.ports[0]!.targetPort || p.containerPort === svc.spec.ports[0]!.targetPort)).toBe(true);
    const pdb = byKind('PodDisruptionBudget')[0] as unknown as { spec: { selector: { matchLabels: Record<string, string> }; minAvailable?: number } };
    for (const [k, v] of Object.entries(pdb.spec.selector.matchLabels)) expect(labels[k]).toBe(v);
    expect(pdb.spec.minAvailable).toBeGreaterThanOrEqual(1);
  });

  it('the HPA scales the Deployment on CPU, from at least two replicas', () => {
    const hpa = byKind('HorizontalPodAutoscaler')[0] as unknown as {
      spec: { scaleTargetRef: { kind: string; name: string }; minReplicas: number; maxReplicas: number; metrics: Array<{ type: string; resource?: { name: string; target: { type: string; averageUtilization: number } } }> };
    };
    expect(hpa.spec.scaleTargetRef).toMatchObject({ kind: 'Deployment', name: dep.metadata.name });
    expect(hpa.spec.minReplicas).toBeGreaterThanOrEqual(2);
    expect(hpa.spec.maxReplicas).toBeGreaterThan(hpa.spec.minReplicas);
    expect(hpa.spec.metrics).toEqual([{ type: 'Resource', resource: { name: 'cpu', target: { type: 'Utilization', averageUtilization: expect.any(Number) } } }]);
  });
});
