import { strict as assert } from 'node:assert';
import { readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { COMMAND_IDS, DISTANCE_REVIEW_VIEW_ID } from '../extension/src/host/pure/contribution-ids';

const repo = path.resolve(__dirname, '..');
interface Contributes {
  commands: Array<{ command: string; title: string; category: string }>;
  views: Record<string, Array<{ id: string; type: string }>>;
  menus: Record<string, Array<{ command: string; when?: string }>>;
  jsonValidation: Array<{ fileMatch: string; url: string }>;
  configuration: { properties: Record<string, { type: string; description: string; default: unknown }> };
}
const pkg = JSON.parse(readFileSync(path.join(repo, 'package.json'), 'utf8')) as {
  activationEvents: string[];
  contributes: Contributes;
  capabilities: { untrustedWorkspaces: { supported: unknown; restrictedConfigurations?: string[] } };
};

// The ids and titles are the contract the e2e tests drive (task brief; common practice, no source).
describe('package.json contributions', () => {
  it('contributes.commands holds exactly the host command ids, each with a title and the Loudword category', () => {
    const expected: Record<string, string> = {
      [COMMAND_IDS.reviewDistances]: 'Review distances',
      [COMMAND_IDS.addTermToStopList]: 'Add term to stop list',
      [COMMAND_IDS.addAllSuggested]: 'Add all suggested terms',
      [COMMAND_IDS.exportHtmlReport]: 'Export HTML report',
      [COMMAND_IDS.openConfig]: 'Open config',
      [COMMAND_IDS.toggleCorpusMarkers]: 'Show or hide loud-term markers',
    };
    const got = Object.fromEntries(pkg.contributes.commands.map((c) => [c.command, c.title]));
    assert.deepEqual(got, expected);
    assert.ok(pkg.contributes.commands.every((c) => c.category === 'Loudword'));
  });

  it('the Distance Review view is a webview whose id is the provider viewType', () => {
    const views = Object.values(pkg.contributes.views).flat();
    assert.deepEqual(views.map((v) => [v.id, v.type]), [[DISTANCE_REVIEW_VIEW_ID, 'webview']]);
  });

  it('activation is lazy: only onCommand and onView events', () => {
    assert.ok(pkg.activationEvents.length > 0);
    for (const e of pkg.activationEvents) assert.match(e, /^(onCommand:loudword\.|onView:loudword\.)/);
  });

  it('the editor-title button is shown for corpus extensions', () => {
    const title = pkg.contributes.menus['editor/title']!.find((m) => m.command === COMMAND_IDS.reviewDistances);
    assert.ok(title?.when);
    for (const ext of ['csv', 'tsv', 'jsonl', 'txt']) assert.ok(title.when.includes(ext), ext);
  });

  it('loudword.json maps to the schema at the repository root, and settings are typed and described', () => {
    assert.deepEqual(pkg.contributes.jsonValidation, [{ fileMatch: 'loudword.json', url: './loudword.schema.json' }]);
    const props = pkg.contributes.configuration.properties;
    assert.deepEqual(Object.keys(props).sort(), ['loudword.neighbors', 'loudword.reviewOnSave', 'loudword.sampleSize', 'loudword.stopListFile']);
    for (const p of Object.values(props)) {
      assert.ok(p.type && p.description && p.default !== undefined);
    }
  });

  it('untrusted workspaces are supported in a limited way and the path setting is restricted', () => {
    assert.equal(pkg.capabilities.untrustedWorkspaces.supported, 'limited');
    assert.deepEqual(pkg.capabilities.untrustedWorkspaces.restrictedConfigurations, ['loudword.stopListFile']);
  });
});

// DEVELOPERS.md "Conventions": pure helpers never import 'vscode', so they run in plain mocha.
describe('host layering', () => {
  function tsFiles(dir: string): string[] {
    return readdirSync(dir, { withFileTypes: true }).flatMap((d) => (d.isDirectory() ? tsFiles(path.join(dir, d.name)) : d.name.endsWith('.ts') ? [path.join(dir, d.name)] : []));
  }

  it('the engine, host/pure and worker never import vscode', () => {
    const files = [
      ...tsFiles(path.join(repo, 'extension/src/engine')),
      ...tsFiles(path.join(repo, 'extension/src/host/pure')),
      ...tsFiles(path.join(repo, 'extension/src/worker')),
    ];
    assert.ok(files.length >= 10);
    for (const f of files) assert.doesNotMatch(readFileSync(f, 'utf8'), /from 'vscode'|require\('vscode'\)/, f);
  });

  it('the host reaches the review engine only through the worker (no static import of startReview or the tokenizer)', () => {
    for (const f of tsFiles(path.join(repo, 'extension/src/host'))) {
      const text = readFileSync(f, 'utf8');
      assert.doesNotMatch(text, /engine\/(review\/start-review|tokenize\/)/, f);
      assert.doesNotMatch(text, /from 'wink/, f);
    }
  });
});
