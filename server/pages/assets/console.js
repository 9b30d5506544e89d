// The console's one script (plain ES module, no build step). Every page works without it; it adds:
// - a draft of each form (data-draft-key) in sessionStorage, restored after a sign-in that expired
//   while the form was being filled, and forgotten once the server confirms the save (data-forget);
// - the live count of items the study pool's filters select (GET /console/item-count);
// - the progress page's refresh every few seconds (GET …/progress.json), without reloading;
// - the kiosk sign's Print button.
// Text is set with textContent; the progress sections come from the server's escaping renderer.

const draftPrefix = 'plotgauge.console.draft.';
const refreshMs = 5000;

function status(text) {
  const region = document.getElementById('console-status');
  if (region) region.textContent = text;
}

function signInLink() {
  return `/sign-in?next=${encodeURIComponent(window.location.pathname + window.location.search)}`;
}

function signedOut() {
  const region = document.getElementById('console-status');
  if (!region) return;
  region.textContent = 'Your sign-in has ended. ';
  const link = document.createElement('a');
  link.href = signInLink();
  link.textContent = 'Sign in again';
  region.append(link, ' (what you typed here is kept in this tab).');
}

function readDraft(key) {
  try {
    const text = sessionStorage.getItem(draftPrefix + key);
    return text ? JSON.parse(text) : null;
  } catch {
    return null;
  }
}

function fieldsOf(form) {
  const pairs = [];
  for (const element of form.elements) {
    if (!element.name || element.name === 'csrf' || element.type === 'hidden') continue;
    if (element.type === 'checkbox' || element.type === 'radio') {
      if (element.checked) pairs.push([element.name, element.value]);
    } else if ('value' in element) {
      pairs.push([element.name, element.value]);
    }
  }
  return pairs;
}

function applyFields(form, pairs) {
  const byName = new Map();
  for (const [name, value] of pairs) byName.set(name, [...(byName.get(name) ?? []), value]);
  for (const element of form.elements) {
    if (!element.name || element.name === 'csrf' || element.type === 'hidden') continue;
    const values = byName.get(element.name) ?? [];
    if (element.type === 'checkbox' || element.type === 'radio')
      element.checked = values.includes(element.value);
    else if ('value' in element && values.length > 0) element.value = values[0];
  }
}

function keepDrafts() {
  for (const key of (document.querySelector('[data-forget]')?.dataset.forget ?? '').split(' ')) {
    if (key) sessionStorage.removeItem(draftPrefix + key);
  }
  for (const form of document.querySelectorAll('form[data-draft-key]')) {
    const key = form.dataset.draftKey;
    const draft = readDraft(key);
    const current = JSON.stringify(fieldsOf(form));
    // A form shown again with its problems holds what was sent: the server's copy wins.
    if (draft && form.dataset.hasProblems !== 'true' && JSON.stringify(draft) !== current) {
      applyFields(form, draft);
      const note = form.querySelector('.draft-note');
      if (note) {
        note.textContent = 'This form shows what you typed earlier in this tab; it is not saved yet. ';
        const discard = document.createElement('button');
        discard.type = 'button';
        discard.className = 'button secondary';
        discard.textContent = 'Discard it';
        discard.addEventListener('click', () => {
          sessionStorage.removeItem(draftPrefix + key);
          window.location.reload();
        });
        note.append(discard);
        note.hidden = false;
      }
      status('Restored what you typed earlier in this tab. It is not saved until you save the form.');
    }
    const save = () => sessionStorage.setItem(draftPrefix + key, JSON.stringify(fieldsOf(form)));
    form.addEventListener('input', save);
    form.addEventListener('change', save);
  }
}

function liveItemCount() {
  const output = document.getElementById('pool-count');
  const form = output?.closest('form');
  if (!output || !form) return;
  let latest = 0;
  const update = async () => {
    const query = new URLSearchParams();
    if (output.dataset.study) query.append('study', output.dataset.study);
    for (const name of ['chartTypes', 'levels', 'scenarios']) {
      for (const box of form.querySelectorAll(`input[name="${name}"]:checked`)) query.append(name, box.value);
    }
    const asked = ++latest;
    try {
      const reply = await fetch(`/console/item-count?${query}`, { headers: { accept: 'application/json' } });
      if (asked !== latest) return;
      if (reply.status === 401) {
        output.textContent = 'Sign in again to see how many items match.';
        signedOut();
        return;
      }
      if (!reply.ok) return;
      const body = await reply.json();
      output.textContent = body.sentence;
      output.dataset.count = String(body.count);
    } catch {
      // Offline for a moment: the count stays as it was; the server counts again on save.
    }
  };
  form.addEventListener('change', (event) => {
    const name = event.target?.name;
    if (name === 'chartTypes' || name === 'levels' || name === 'scenarios') update();
  });
  // A restored draft may have other filters than the page was drawn with.
  update();
}

function liveProgress() {
  const box = document.querySelector('[data-progress]');
  if (!box) return;
  const url = box.dataset.url;
  const stamp = document.getElementById('progress-updated');
  const refresh = async () => {
    if (document.hidden) return schedule();
    try {
      const reply = await fetch(url, { headers: { accept: 'application/json' } });
      if (reply.status === 401) return signedOut();
      if (reply.ok) {
        const body = await reply.json();
        const parsed = new DOMParser().parseFromString(body.html, 'text/html');
        box.replaceChildren(...parsed.body.childNodes);
        box.dataset.at = body.progress.at;
        if (stamp) {
          stamp.dataset.at = body.progress.at;
          stamp.textContent = `Numbers as of ${body.progress.at.slice(11, 19)} UTC, ${body.progress.at.slice(0, 10)}.`;
        }
        status('');
      }
    } catch {
      status('Cannot reach the server just now; trying again.');
    }
    schedule();
  };
  const schedule = () => window.setTimeout(refresh, refreshMs);
  schedule();
}

function printButton() {
  for (const button of document.querySelectorAll('[data-print]')) {
    button.hidden = false;
    button.addEventListener('click', () => window.print());
  }
}

function focusProblems() {
  document.getElementById('form-problems')?.focus();
}

keepDrafts();
liveItemCount();
liveProgress();
printButton();
focusProblems();
