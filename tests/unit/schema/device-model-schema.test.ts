import { readFileSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import { BJT_PARAMETERS, BJT_PARAMETER_NAMES } from '#shared/engine/bjt-parameters';
import { designSchemaWithDeviceModel, specSchemaWithDeviceModel } from '#shared/schema/device-model-schema';
import { validateDesign, validateSpec } from '#shared/validate';
import { specCrossFieldIssues } from '#shared/validation/cross-field-rules';
import { DESIGN_SCHEMA_PATH, SPEC_SCHEMA_PATH } from '../../../scripts/write-topology-schema';
import { MINIMAL_DESIGN, MINIMAL_SPEC, paths, printed } from './schema-fixtures';

type Node = Record<string, unknown> & { properties?: Record<string, Node> };

const fromFile = (path: string) => JSON.parse(readFileSync(path, 'utf8')) as Node;
const drift = 'shared/schema drifted from shared/engine/bjt-parameters.ts: run `npm run generate:topologies`';

/** An invented small-signal NPN card (Fernhollow demo values). */
const CARD = { IS: 2e-15, BF: 180, VAF: 90, IKF: 0.08, ISE: 5e-15, NE: 1.6, RB: 60, CJE: 9e-12, CJC: 4e-12, TF: 4e-10, XTB: 1.5 };

function designWithDevice(device: Record<string, unknown>) {
  return { ...MINIMAL_DESIGN, device };
}

describe('the schemas carry device.model from the Gummel-Poon parameter list', () => {
  test('design.schema.json and spec.schema.json are the builder\u2019s output', () => {
    const design = fromFile(DESIGN_SCHEMA_PATH);
    const spec = fromFile(SPEC_SCHEMA_PATH);
    expect(design, drift).toEqual(designSchemaWithDeviceModel(design));
    expect(spec, drift).toEqual(specSchemaWithDeviceModel(spec));
  });

  test('the model lists exactly the contract\u2019s parameter names, in both schemas', () => {
    const contractNames =
      'IS, BF, NF, VAF, IKF, ISE, NE, BR, NR, VAR, IKR, ISC, NC, RB, RE, RC, CJE, VJE, MJE, CJC, VJC, MJC, CJS, VJS, MJS, FC, TF, TR, EG, XTI, XTB, KF, AF'.split(', ');
    for (const path of [DESIGN_SCHEMA_PATH, SPEC_SCHEMA_PATH]) {
      const model = fromFile(path).properties!.device.properties!.model;
      expect(Object.keys(model.properties!), path).toEqual(contractNames);
      expect(model.additionalProperties, path).toBe(false);
    }
  });

  test('each parameter states the default ngspice gives it (bjtsetup.c)', () => {
    // ngspice src/spicelib/devices/bjt/bjtsetup.c: the values set when a card leaves a parameter out
    const ngspice: Record<string, number> = {
      IS: 1e-16, BF: 100, NF: 1, NE: 1.5, BR: 1, NR: 1, NC: 2, RB: 0, RE: 0, RC: 0, CJE: 0, VJE: 0.75, MJE: 0.33, TF: 0,
      CJC: 0, VJC: 0.75, MJC: 0.33, TR: 0, CJS: 0, VJS: 0.75, MJS: 0, XTB: 0, EG: 1.11, XTI: 3, KF: 0, AF: 1, ISE: 0, ISC: 0, FC: 0.5,
    };
    for (const [name, value] of Object.entries(ngspice)) expect(BJT_PARAMETERS[name as keyof typeof BJT_PARAMETERS].default, name).toBe(value);
    for (const name of ['VAF', 'IKF', 'VAR', 'IKR'] as const) expect(BJT_PARAMETERS[name].default, name).toBe(Infinity);
    expect(BJT_PARAMETER_NAMES).toHaveLength(33);
  });
});

describe('validating a design with a model card', () => {
  test('a card stands for beta, Early voltage and IS: none of them is required', () => {
    const result = validateDesign(designWithDevice({ model: CARD }));
    expect(result.ok).toBe(true);
    if (result.ok) {
      expect(result.value.device.model).toEqual(CARD);
      expect(result.value.device.beta).toBeUndefined();
    }
  });

  test('without a card, beta is still required', () => {
    expect(printed(validateDesign(designWithDevice({ earlyVoltageV: 80 })))).toEqual(['/device/beta: is required']);
  });

  test('another parameter name is refused, named at its path', () => {
    expect(printed(validateDesign(designWithDevice({ model: { ...CARD, XCJC: 1 } })))).toEqual([
      '/device/model/XCJC: is not a known field here (remove it or check its spelling)',
    ]);
    expect(paths(validateDesign(designWithDevice({ model: { is: 1e-15 } })))).toEqual(['/device/model/is']);
  });

  test.each([
    ['BF', 0],
    ['IS', 0],
    ['VAF', 0.5],
    ['RB', -1],
    ['CJE', 1e-3],
    ['FC', 1],
    ['BR', 0],
    ['NF', 0],
  ])('%s = %s is outside its physical bounds', (name, value) => {
    expect(paths(validateDesign(designWithDevice({ model: { ...CARD, [name]: value } })))).toEqual([`/device/model/${name}`]);
  });

  test('VAF, IKF, VAR and IKR of 0 read as infinite, as SPICE reads them, and are accepted', () => {
    expect(validateDesign(designWithDevice({ model: { ...CARD, VAF: 0, IKF: 0, VAR: 0, IKR: 0 } })).ok).toBe(true);
  });

  test('beta, Early voltage and IS given beside the card must equal BF, VAF and IS', () => {
    expect(validateDesign(designWithDevice({ beta: 180, earlyVoltageV: 90, saturationCurrentA: 2e-15, model: CARD })).ok).toBe(true);
    expect(printed(validateDesign(designWithDevice({ beta: 120, earlyVoltageV: 80, saturationCurrentA: 1e-15, model: CARD })))).toEqual([
      "/device/beta: must equal the model card's BF (180 A/A), got 120 A/A",
      "/device/earlyVoltageV: must equal the model card's VAF (90 V), got 80 V",
      "/device/saturationCurrentA: must equal the model card's IS (2e-15 A), got 1e-15 A",
    ]);
  });

  test('a parameter the card leaves out is compared at SPICE\u2019s default', () => {
    expect(printed(validateDesign(designWithDevice({ beta: 120, model: { IS: 1e-15 } })))).toEqual([
      "/device/beta: must equal the model card's BF (100 A/A, SPICE's default as the card leaves it out), got 120 A/A",
    ]);
    expect(validateDesign(designWithDevice({ beta: 100, earlyVoltageV: 0, model: { IS: 1e-15 } })).ok).toBe(true);
    expect(paths(validateDesign(designWithDevice({ earlyVoltageV: 50, model: { IS: 1e-15 } })))).toEqual(['/device/earlyVoltageV']);
  });
});

describe('comparing a device field with its card', () => {
  test('a value read back from text may differ in the last digits (within 1e-9 relative): accepted; beyond, refused', () => {
    expect(validateDesign(designWithDevice({ beta: 180.00000001, saturationCurrentA: 2.0000000001e-15, model: CARD })).ok).toBe(true);
    expect(paths(validateDesign(designWithDevice({ beta: 180.001, model: CARD })))).toEqual(['/device/beta']);
  });

  test('an Early voltage of 0 (infinite) against a finite VAF is refused; a finite one against no VAF names the default as infinite', () => {
    expect(printed(validateDesign(designWithDevice({ earlyVoltageV: 0, model: CARD })))).toEqual([
      "/device/earlyVoltageV: must equal the model card's VAF (90 V), got 0 V",
    ]);
    expect(printed(validateDesign(designWithDevice({ earlyVoltageV: 50, model: { IS: 1e-15 } })))).toEqual([
      "/device/earlyVoltageV: must equal the model card's VAF (infinite, SPICE's default as the card leaves it out), got 50 V",
    ]);
    expect(printed(validateDesign(designWithDevice({ earlyVoltageV: 50, model: { IS: 1e-15, VAF: 0 } })))).toEqual([
      "/device/earlyVoltageV: must equal the model card's VAF (infinite), got 50 V",
    ]);
  });

  test('a spec’s card is held to the same comparison at each field’s path', () => {
    expect(paths(validateSpec({ ...MINIMAL_SPEC, device: { beta: 180, earlyVoltageV: 91, saturationCurrentA: 3e-15, model: CARD } }))).toEqual([
      '/device/earlyVoltageV',
      '/device/saturationCurrentA',
    ]);
  });
});

describe('an empty card is no card', () => {
  test('a design or spec whose model has no parameter given (a form\u2019s untouched card section) keeps its own beta and Early voltage', () => {
    expect(validateDesign(designWithDevice({ beta: 120, earlyVoltageV: 80, model: {} })).ok).toBe(true);
    const spec = validateSpec({ ...MINIMAL_SPEC, device: { beta: 150, earlyVoltageV: 60, model: {} } });
    expect(spec.ok && [spec.value.device.beta, spec.value.device.earlyVoltageV]).toEqual([150, 60]);
    // the spec form's cross-field check sees blank card fields as undefined
    expect(specCrossFieldIssues({ ...(spec.ok ? spec.value : {}), device: { beta: 150, earlyVoltageV: 60, model: { IS: undefined, VAF: undefined } } } as never)).toEqual([]);
  });
});

describe('validating a spec with a model card', () => {
  test('with a card, the device fields the spec leaves out are the card\u2019s BF, VAF and IS, not the schema defaults', () => {
    const withCard = validateSpec({ ...MINIMAL_SPEC, device: { model: CARD } });
    expect(withCard.ok && withCard.value.device).toMatchObject({ beta: 180, earlyVoltageV: 90, saturationCurrentA: 2e-15, model: CARD });
    // a card without VAF: infinite, written 0 as the device field writes it; BF left out: SPICE's 100
    const sparse = validateSpec({ ...MINIMAL_SPEC, device: { model: { IS: 3e-15 } } });
    expect(sparse.ok && sparse.value.device).toMatchObject({ beta: 100, earlyVoltageV: 0, saturationCurrentA: 3e-15 });
    const plain = validateSpec(MINIMAL_SPEC);
    expect(plain.ok && [plain.value.device.beta, plain.value.device.earlyVoltageV, plain.value.device.saturationCurrentA]).toEqual([100, 100, undefined]);
  });

  test('the spec form can validate it: no condition (if/then) in the spec schema, which its precompiled validator cannot evaluate', () => {
    const device = fromFile(SPEC_SCHEMA_PATH).properties!.device;
    expect(Object.keys(device)).not.toContain('if');
    expect(device.properties!.beta.default).toBe(100);
  });

  test('a spec\u2019s beta beside a card must equal BF, at the JSON path', () => {
    expect(printed(validateSpec({ ...MINIMAL_SPEC, device: { beta: 150, model: CARD } }))).toEqual([
      "/device/beta: must equal the model card's BF (180 A/A), got 150 A/A",
    ]);
  });

  test('an unknown parameter in a spec\u2019s card is refused naming it', () => {
    expect(paths(validateSpec({ ...MINIMAL_SPEC, device: { model: { ...CARD, BETA: 200 } } }))).toEqual(['/device/model/BETA']);
  });
});
