import userEvent from '@testing-library/user-event';
import { Route, Routes } from 'react-router-dom';
import type { ChecklistTemplateContent, ChecklistTemplateDetail } from '@crankjournal/shared-types';
import { render, screen } from '../../../test-utils/render';
import { json, signIn, signOut, stubFetch, type StubRequest } from '../../../test-utils/http';
import ChecklistTemplatePage from './ChecklistTemplate.page';

const content: ChecklistTemplateContent = {
  name: 'Pre-lube',
  purpose: 'pre_lube',
  requiredWhen: 'before_start',
  requiredDuty: 'pre_lube',
  description: '',
  sections: [{ key: 's1', title: 'Oil', items: [{ key: 'valves', kind: 'tick', label: 'Oil valves open', required: true }] }],
};

function template(withdrawn: boolean): ChecklistTemplateDetail {
  const version = { version: 1, issuedAt: '2026-05-01T09:00:00.000Z', issuedByName: 'C. Engineer', changeNote: 'First issue.' };
  return {
    id: 't1',
    engineId: 'e1',
    engineName: 'No. 2 engine',
    name: 'Pre-lube',
    purpose: 'pre_lube',
    requiredWhen: 'before_start',
    requiredDuty: 'pre_lube',
    currentVersion: 1,
    issuedAt: version.issuedAt,
    itemCount: 1,
    hasDraft: false,
    withdrawn,
    state: withdrawn ? 'withdrawn' : 'issued',
    current: { ...version, templateId: 't1', content },
    draft: null,
    draftUpdatedAt: null,
    versions: [version],
  };
}

function show() {
  render(
    <Routes>
      <Route path="/checklists/templates/:id" element={<ChecklistTemplatePage />} />
    </Routes>,
    { route: '/checklists/templates/t1' },
  );
}

describe('ChecklistTemplatePage', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  it('the chief engineer withdraws an issued template through /withdraw; the versions say who issued them', async () => {
    const user = userEvent.setup();
    signIn('chief_engineer');
    const posted: StubRequest[] = [];
    stubFetch({
      'GET /checklist-templates/t1': template(false),
      'POST /checklist-templates/t1/withdraw': (req: StubRequest) => {
        posted.push(req);
        return json(template(true));
      },
    });
    show();
    expect(await screen.findByText('C. Engineer')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: /^Withdraw this template/ }));
    await vi.waitFor(() => expect(posted).toHaveLength(1));
    expect(posted[0]!.method).toBe('POST');
  });

  it('a withdrawn template is reissued through /reissue', async () => {
    const user = userEvent.setup();
    signIn('chief_engineer');
    const stub = stubFetch({
      'GET /checklist-templates/t1': template(true),
      'POST /checklist-templates/t1/reissue': template(false),
    });
    show();
    expect(await screen.findByText('Withdrawn')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Reissue this template' }));
    await vi.waitFor(() => expect(stub.calls.map((c) => `${c.method} ${c.path}`)).toContain('POST /checklist-templates/t1/reissue'));
    expect(stub.calls.some((c) => c.path.endsWith('/withdraw'))).toBe(false);
  });
});
