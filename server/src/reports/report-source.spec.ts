import { describe, expect, it } from 'vitest';
import { JOB_EXAMPLE } from '../jobs/jobs.examples';
import { type ReportRecords, reportSourceOf, sourceSha256 } from './report-source';

/** The records around the example job: a customer, a machine with a 300 kg rotor, a family with a grade. */
function records(overrides: Partial<ReportRecords['machine']> = {}): ReportRecords {
  return {
    shopName: 'Ridgeline Rotor Service',
    customer: {
      name: 'Alder Creek Land Clearing',
      siteAddress: '14 Sawmill Road, Fernhollow',
      email: 'office@aldercreek-clearing.test',
      phone: null,
      contacts: [{ name: 'Juno Hartwell', role: 'Fleet foreman' }],
    },
    machine: {
      hours: 1460,
      rotorMassKg: 300,
      planes: [{ correctionRadiusMm: 210 }, { correctionRadiusMm: 210 }],
      acceptance: null,
      ...overrides,
    },
    family: { acceptance: { kind: 'balance-grade', grade: 'G16' } },
  };
}

describe('reportSourceOf', () => {
  it('says where the acceptance level comes from and works out a grade’s permissible unbalance', () => {
    const fromFamily = reportSourceOf(JOB_EXAMPLE, records());
    expect(fromFamily.acceptance).toMatchObject({
      source: 'family',
      level: { kind: 'balance-grade', grade: 'G16' },
    });
    // U_per = 9549 G m / n (ISO 21940-11, as the engine's balanceTolerance): G16, 300 kg, at the job's speed.
    const speedRpm = JOB_EXAMPLE.setup!.operatingSpeedRpm;
    expect(fromFamily.acceptance!.permissible!.totalGmm).toBeCloseTo((9549.3 * 16 * 300) / speedRpm, 0);
    expect(fromFamily.acceptance!.permissible!.perPlaneGmm).toHaveLength(2);

    const fromMachine = reportSourceOf(
      JOB_EXAMPLE,
      records({ acceptance: { kind: 'shop-target', amplitude: 0.12, unit: 'in/s-pk' } }),
    );
    expect(fromMachine.acceptance).toMatchObject({
      source: 'machine',
      level: { kind: 'shop-target' },
      permissible: null,
    });
    expect(fromMachine.jobNumber).toBe(`J-${String(JOB_EXAMPLE.id).padStart(6, '0')}`);
  });
});

describe('sourceSha256', () => {
  it('is the same for the same report, whatever the order of keys or the job’s version', () => {
    const source = reportSourceOf(JOB_EXAMPLE, records());
    const reordered = Object.fromEntries(Object.entries(source).reverse()) as typeof source;
    expect(sourceSha256(reordered)).toBe(sourceSha256(source));
    expect(sourceSha256({ ...source, jobVersion: source.jobVersion + 4 })).toBe(sourceSha256(source));
  });

  it('changes with anything the report prints', () => {
    const source = reportSourceOf(JOB_EXAMPLE, records());
    expect(sourceSha256(reportSourceOf(JOB_EXAMPLE, records({ hours: 1461 })))).not.toBe(
      sourceSha256(source),
    );
    expect(sourceSha256({ ...source, shopName: 'Another shop' })).not.toBe(sourceSha256(source));
  });
});
