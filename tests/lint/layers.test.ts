import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

// The layer rules live in eslint.config.js (eslint-plugin-boundaries) and run with `npm run lint`.
// Here each rule is shown to fire on a small source placed where a break would be, and to stay quiet
// on the allowed direction, so a config change that silently disables one fails a test.
const eslint = new ESLint({ cwd: process.cwd() });

async function layerErrors(filePath: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return result.messages.filter((m) => m.ruleId === 'boundaries/dependencies').map((m) => m.message);
}

describe('layer rules of the linter', () => {
  it('keep shared/ free of client and server imports', async () => {
    const errors = await layerErrors(
      'shared/metrics/probe.ts',
      "import { paths } from '@/config/paths';\nimport { loadConfig } from '../../server/config';\nexport const x = [paths, loadConfig];\n",
    );
    expect(errors).toHaveLength(2);
    expect(errors[0]).toMatch(/shared\/ is used by the client, the server and the CLI/);
  });

  it('keep one client feature out of another, but let a feature use its own files', async () => {
    const across = await layerErrors(
      'src/features/sessions/components/probe.ts',
      "import { useStage } from '@/features/clip-workspace/components/stage/stage-context';\nexport const x = useStage;\n",
    );
    expect(across).toEqual(['features do not import one another; compose them in src/app']);
    const within = await layerErrors(
      'src/features/clip-workspace/components/probe.ts',
      "import { useStage } from '@/features/clip-workspace/components/stage/stage-context';\nexport const x = useStage;\n",
    );
    expect(within).toEqual([]);
  });

  it('keep client-wide code free of features, and the client free of server code', async () => {
    expect(
      await layerErrors(
        'src/lib/probe.ts',
        "import { useStage } from '@/features/clip-workspace/components/stage/stage-context';\nexport const x = useStage;\n",
      ),
    ).toHaveLength(1);
    expect(
      await layerErrors(
        'src/app/probe.ts',
        "import { createApp } from '@server/app';\nexport const x = createApp;\n",
      ),
    ).toEqual(['the client talks to the server over HTTP only']);
  });

  it('keep server routes away from repositories; services may use them', async () => {
    const code =
      "import { FlagRepository } from '../repositories/flag.repository';\nexport const x = FlagRepository;\n";
    expect(await layerErrors('server/routes/probe.ts', code)).toEqual([
      'routes call services; only services and their helpers use repositories',
    ]);
    expect(await layerErrors('server/services/probe.ts', code)).toEqual([]);
  });
});
