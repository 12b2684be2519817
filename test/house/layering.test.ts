import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { ESLint } from 'eslint';
import { afterAll, describe, expect, it } from 'vitest';

// The layering of the house (DEVELOPERS.md, "Layout") is an ESLint rule in eslint.config.js; these
// cases prove that the rule fires on each kind of breach and stays quiet on what is allowed, so a
// change to the configuration cannot switch it off unnoticed.
const eslint = new ESLint({ cwd: process.cwd() });

async function problems(path: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: path });
  return result.messages.map((m) => m.ruleId ?? m.message);
}

const restricted = '@typescript-eslint/no-restricted-imports';

describe('the import-boundary rule', () => {
  it('keeps lib/ free of the app, the worker and the command line', async () => {
    expect(await problems('lib/analysis/x.ts', "import { a } from '../../src/main';\nexport const b = a;\n")).toContain(
      restricted,
    );
    expect(
      await problems('lib/model/x.ts', "import { a } from '../../workers/simulationApi';\nexport const b = a;\n"),
    ).toContain(restricted);
    expect(await problems('lib/plan/x.ts', "import { a } from '../../cli/main';\nexport const b = a;\n")).toContain(
      restricted,
    );
  });

  it('keeps lib/io to formats: no analysis, plan, userfile, run or sweep at run time', async () => {
    for (const layer of ['analysis/scales', 'plan/units', 'userfile/analyzeFile', 'run/runPlan', 'sweep/sweepSpec'])
      expect(await problems('lib/io/x.ts', `import { a } from '../${layer}';\nexport const b = a;\n`)).toContain(
        restricted,
      );
    // A type names the shape a writer writes; it vanishes at run time.
    expect(
      await problems(
        'lib/io/x.ts',
        "import type { ZonalMeans } from '../analysis/zonalMean';\nexport type Z = ZonalMeans;\n",
      ),
    ).toEqual([]);
  });

  it('keeps the stepper out of lib/analysis and the model arrays out of lib/plan', async () => {
    expect(
      await problems('lib/analysis/x.ts', "import { Stepper } from '../model/stepper';\nexport const s = Stepper;\n"),
    ).toContain(restricted);
    expect(
      await problems('lib/analysis/x.ts', "import { Model } from '../model/model';\nexport const m = Model;\n"),
    ).toContain(restricted);
    expect(
      await problems('lib/plan/x.ts', "import { Grid } from '../model/fields';\nexport const g = Grid;\n"),
    ).toContain(restricted);
    expect(
      await problems(
        'lib/plan/x.ts',
        "import { DEFAULT_PARAMS } from '../model/params';\nexport const p = DEFAULT_PARAMS;\n",
      ),
    ).toEqual([]);
  });

  it('keeps lib/model at the bottom', async () => {
    expect(
      await problems('lib/model/x.ts', "import { a } from '../analysis/scales';\nexport const b = a;\n"),
    ).toContain(restricted);
    expect(
      await problems('lib/model/x.ts', "import { InputError } from '../inputError';\nexport const e = InputError;\n"),
    ).toEqual([]);
  });
});

describe('the cycle rule', () => {
  // The rule follows files on disk, so the cycle is written into a folder of its own under test/.
  const dir = mkdtempSync(join(process.cwd(), 'test', 'house', 'cycle-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it('fails on two modules that import each other', async () => {
    writeFileSync(join(dir, 'a.ts'), "import { b } from './b';\nexport const a = () => b;\n");
    writeFileSync(join(dir, 'b.ts'), "import { a } from './a';\nexport const b = () => a;\n");
    const [result] = await eslint.lintFiles([join(dir, 'a.ts')]);
    expect(result.messages.map((m) => m.ruleId)).toContain('import-x/no-cycle');
  });
});
