// Adds @ApiAnswer('Type') to every controller route that documents no success answer yet and whose
// declared return type is a shared-types type (Promise<RunDetail>, Promise<RunSummary[]>), and adds the
// import. Routes it cannot decide (files, no body, other types) are listed for a person to decorate.
//   node scripts/annotate-answers.mjs [files...]   (default: every src/**/*.controller.ts)
import { readdirSync, readFileSync, writeFileSync, statSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import ts from 'typescript';

const here = dirname(fileURLToPath(import.meta.url));
const src = join(here, '..', 'src');
const generated = readFileSync(join(src, 'common', 'openapi', 'shared-schemas.generated.ts'), 'utf8');
const shared = new Set([...generated.matchAll(/^ {2}\| '([^']+)'$/gm)].map((m) => m[1]));
const HTTP = new Set(['Get', 'Post', 'Put', 'Patch', 'Delete']);
const DOCUMENTED = /^(ApiAnswer|ApiAnswerSchema|ApiFileAnswer|ApiNoContent|ApiOkResponse|ApiCreatedResponse|ApiResponse)$/;

const walk = (dir) =>
  readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    return statSync(p).isDirectory() ? walk(p) : p.endsWith('.controller.ts') ? [p] : [];
  });

const decoratorName = (d) => {
  const e = d.expression;
  return ts.isCallExpression(e) ? e.expression.getText() : e.getText();
};

const files = process.argv.slice(2).length ? process.argv.slice(2) : walk(src);
const leftOver = [];
for (const file of files) {
  let text = readFileSync(file, 'utf8');
  const sf = ts.createSourceFile(file, text, ts.ScriptTarget.Latest, true);
  const inserts = [];
  const visit = (node) => {
    if (ts.isMethodDeclaration(node)) {
      const decorators = ts.getDecorators(node) ?? [];
      const names = decorators.map(decoratorName);
      if (names.some((n) => HTTP.has(n)) && !names.some((n) => DOCUMENTED.test(n))) {
        let type = node.type?.getText() ?? '';
        type = type.replace(/^Promise<(.*)>$/s, '$1').trim();
        const array = type.endsWith('[]');
        const name = type.replace(/\[\]$/, '');
        const where = `${relative(join(here, '..'), file)}: ${node.name.getText()}(): ${node.type?.getText() ?? '(no type)'}`;
        if (shared.has(name)) {
          const first = decorators[0];
          const indent = text.slice(text.lastIndexOf('\n', first.getStart()) + 1, first.getStart());
          inserts.push({ at: first.getStart(), text: `@ApiAnswer('${name}'${array ? ', { array: true }' : ''})\n${indent}` });
        } else leftOver.push(where);
      }
    }
    ts.forEachChild(node, visit);
  };
  visit(sf);
  if (!inserts.length) continue;
  for (const i of inserts.sort((a, b) => b.at - a.at)) text = text.slice(0, i.at) + i.text + text.slice(i.at);
  if (!/import \{[^}]*\bApiAnswer\b[^}]*\} from '[^']*api-answer\.decorator\.js'/.test(text)) {
    const rel = relative(dirname(file), join(src, 'common', 'openapi', 'api-answer.decorator.js'));
    const lastImport = [...text.matchAll(/^import [^;]+;$/gms)].pop();
    const at = lastImport ? lastImport.index + lastImport[0].length : 0;
    text = `${text.slice(0, at)}\nimport { ApiAnswer } from '${rel.startsWith('.') ? rel : './' + rel}';${text.slice(at)}`;
  }
  writeFileSync(file, text);
  console.log(`${relative(join(here, '..'), file)}: ${inserts.length} answer(s) documented`);
}
if (leftOver.length)
  console.log(`\nto decorate by hand (ApiFileAnswer, ApiNoContent, ApiAnswerSchema, or a shared type):\n  ${leftOver.join('\n  ')}`);
