// The respondent page: welcome → consent → background questions → one chart at a time → end.
// Plain browser JavaScript (an ES module, no build step, no framework). It talks only to this
// server's JSON API (see the respondent API contract) and never puts text into the page as HTML:
// every string goes through textContent. The one exception is the chart, an SVG that our own
// renderer produced on the server; it is parsed as SVG (scripts in it would not run, and the
// Content-Security-Policy forbids them anyway).
import { isRetryableStatus, retryDelay } from './retry.js';

/** @type {Record<string, string>} */
const strings = JSON.parse(document.getElementById('strings')?.textContent ?? '{}');
const main = /** @type {HTMLElement} */ (document.getElementById('main'));
const root = /** @type {HTMLElement} */ (document.getElementById('app'));
const statusRegion = /** @type {HTMLElement} */ (document.getElementById('status'));
const joinCode = main.dataset.joinCode ?? '';
const tokenKey = `plotgauge.attempt.${joinCode}`;
const pendingKey = `plotgauge.pending.${joinCode}`;
const svgNamespace = 'http://www.w3.org/2000/svg';

/** The attempt as the server last described it; null on the welcome screen. */
let state = null;
/** Bumped on every reset: loops and timers from an older visitor stop when they see a newer one. */
let generation = 0;
/** True while a POST is on its way (or waiting to be retried). */
let saving = false;
let idleTimer = 0;
let endTimer = 0;
let shownAt = 0;

// ---------------------------------------------------------------- small helpers

/** A string from the strings file with `{name}` placeholders filled in. */
function t(key, values = {}) {
  const text = strings[key] ?? key;
  return text.replace(/\{(\w+)\}/g, (whole, name) => (name in values ? String(values[name]) : whole));
}

/**
 * Creates an element. `props`: attributes (strings/numbers/booleans) plus `text` for textContent
 * and `on*` functions for event listeners. Children: nodes, strings (as text) or null.
 */
function h(tag, props = {}, ...children) {
  const node = document.createElement(tag);
  for (const [name, value] of Object.entries(props)) {
    if (value === undefined || value === null || value === false) continue;
    if (name === 'text') node.textContent = String(value);
    else if (name.startsWith('on') && typeof value === 'function')
      node.addEventListener(name.slice(2), value);
    else node.setAttribute(name, value === true ? '' : String(value));
  }
  for (const child of children) {
    if (child === null || child === undefined || child === false) continue;
    node.append(typeof child === 'string' ? document.createTextNode(child) : child);
  }
  return node;
}

/** localStorage that survives being unavailable (private browsing, full disk). */
const store = {
  memory: new Map(),
  get(key) {
    try {
      return window.localStorage.getItem(key);
    } catch {
      return this.memory.get(key) ?? null;
    }
  },
  set(key, value) {
    this.memory.set(key, value);
    try {
      window.localStorage.setItem(key, value);
    } catch {
      // Kept in memory only.
    }
  },
  remove(key) {
    this.memory.delete(key);
    try {
      window.localStorage.removeItem(key);
    } catch {
      // Nothing stored.
    }
  },
};

function readPending() {
  try {
    const raw = store.get(pendingKey);
    return raw ? JSON.parse(raw) : null;
  } catch {
    return null;
  }
}

/** Shows a calm notice in the polite live region (empty text clears it). */
function notify(text) {
  statusRegion.textContent = text;
  statusRegion.hidden = text === '';
}

function wait(ms) {
  return new Promise((resolve) => {
    const timer = window.setTimeout(done, ms);
    // Coming back online retries at once instead of waiting out the backoff.
    window.addEventListener('online', done, { once: true });
    function done() {
      window.clearTimeout(timer);
      window.removeEventListener('online', done);
      resolve(undefined);
    }
  });
}

// ---------------------------------------------------------------- talking to the server

/** One request. Resolves with { status, body }; rejects only when the network fails. */
async function request(method, path, body, token = store.get(tokenKey)) {
  const headers = { accept: 'application/json' };
  if (token) headers.authorization = `Bearer ${token}`;
  if (body !== undefined) headers['content-type'] = 'application/json';
  const response = await fetch(path, {
    method,
    headers,
    body: body === undefined ? undefined : JSON.stringify(body),
    cache: 'no-store',
    credentials: 'omit',
  });
  let payload = null;
  try {
    payload = await response.json();
  } catch {
    payload = null;
  }
  return { status: response.status, body: payload };
}

/**
 * Sends a request until the server gives a final answer. A network failure, a 5xx or a 429 keeps
 * the request (in localStorage when `remember` is set, so a reload can send it again), shows a calm
 * notice and tries again after a capped, jittered backoff. The body is the same every time, and the
 * API treats a repeated answer as the same answer, so a retry never stores anything twice.
 * Returns null when the page was reset for the next visitor meanwhile.
 */
async function sendReliably(method, path, body, remember) {
  const mine = generation;
  saving = true;
  if (remember) store.set(pendingKey, JSON.stringify({ ...remember, method, path, body }));
  try {
    for (let failures = 0; ; failures += 1) {
      let result = null;
      try {
        result = await request(method, path, body);
      } catch {
        result = null;
      }
      if (mine !== generation) return null;
      if (result !== null && !isRetryableStatus(result.status)) {
        if (remember) store.remove(pendingKey);
        if (failures > 0) notify(t('saved'));
        return result;
      }
      notify(t('savingRetry'));
      await wait(retryDelay(failures, Math.random()));
      if (mine !== generation) return null;
    }
  } finally {
    if (mine === generation) saving = false;
  }
}

/** Acts on a final answer from the server to anything the attempt sent. */
function handleResult(result) {
  if (result === null) return;
  const { status, body } = result;
  if (status >= 200 && status < 300) {
    const next =
      body && typeof body === 'object' && 'attempt' in body && body.step === undefined ? body.attempt : body;
    show(next);
    return;
  }
  const code = body?.error?.code;
  if (status === 401) {
    forgetAttempt();
    showWelcome(t('sessionEnded'));
    return;
  }
  if (status === 409) {
    // The server knows better where this attempt is (answered elsewhere, finished, moved on).
    void refresh();
    return;
  }
  if (code === 'JOIN_CODE_NOT_FOUND' || status === 404) {
    showWelcome(t('codeNotFound'), true);
    return;
  }
  if (code === 'STUDY_CLOSED' || status === 410) {
    showWelcome(t('studyClosed'), true);
    return;
  }
  notify(t('problem'));
  enableForm();
}

async function refresh() {
  const result = await sendReliably('GET', '/api/attempt', undefined, null);
  if (result === null) return;
  if (result.status === 200) {
    show(result.body);
    resumePending();
  } else handleResult(result);
}

function forgetAttempt() {
  store.remove(tokenKey);
  store.remove(pendingKey);
  state = null;
}

// ---------------------------------------------------------------- kiosk: idle and next visitor

function kiosk() {
  return state?.study?.kiosk === true;
}

function armIdleTimer() {
  window.clearTimeout(idleTimer);
  if (!kiosk() || state === null) return;
  const seconds = Math.max(1, Number(state.study.idleSeconds) || 120);
  idleTimer = window.setTimeout(onIdle, seconds * 1000);
}

function onIdle() {
  // Never drop an answer that is still on its way; wait for it.
  if (saving) armIdleTimer();
  else void nextVisitor();
}

/** Ends this visitor's turn: the server marks the attempt abandoned, the page returns to welcome. */
async function nextVisitor() {
  const token = store.get(tokenKey);
  generation += 1;
  saving = false;
  window.clearTimeout(idleTimer);
  window.clearTimeout(endTimer);
  forgetAttempt();
  showWelcome('');
  if (token) void leave(token);
}

/** Tells the server this attempt is over, a few times at most (best effort, in the background). */
async function leave(token) {
  for (let failures = 0; failures < 6; failures += 1) {
    try {
      const result = await request('POST', '/api/attempt/leave', {}, token);
      if (!isRetryableStatus(result.status)) return;
    } catch {
      // Offline: try again shortly.
    }
    await wait(retryDelay(failures, Math.random()));
  }
}

for (const type of ['pointerdown', 'keydown', 'input', 'wheel', 'touchstart', 'scroll']) {
  window.addEventListener(
    type,
    () => {
      if (state !== null && state.step !== 'finished' && state.step !== 'declined') armIdleTimer();
    },
    { passive: true, capture: true },
  );
}

// ---------------------------------------------------------------- screens

/** Replaces the screen and moves focus to its heading, so keyboard and screen-reader users start there. */
function mount(screen, focus = true) {
  root.replaceChildren(screen);
  // The chart screen uses the full width of a kiosk screen; text screens keep short lines.
  main.classList.toggle('wide', screen.classList.contains('item'));
  root.setAttribute('aria-busy', 'false');
  const heading = screen.querySelector('h1');
  if (focus && heading) {
    heading.setAttribute('tabindex', '-1');
    heading.focus();
  }
  window.scrollTo(0, 0);
}

let firstScreen = true;

function show(next) {
  state = next;
  window.clearTimeout(endTimer);
  const focus = !firstScreen;
  firstScreen = false;
  switch (next.step) {
    case 'consent':
      mount(consentScreen(next), focus);
      break;
    case 'background':
      mount(backgroundScreen(next), focus);
      break;
    case 'item':
      mount(itemScreen(next), focus);
      shownAt = performance.now();
      break;
    case 'finished':
      mount(endScreen(next), focus);
      break;
    case 'declined':
      mount(declinedScreen(next), focus);
      break;
    default:
      forgetAttempt();
      showWelcome('');
      return;
  }
  armIdleTimer();
  if ((next.step === 'finished' || next.step === 'declined') && next.study.kiosk) {
    const seconds = Math.min(15, Math.max(3, Number(next.study.idleSeconds) || 15));
    endTimer = window.setTimeout(() => void nextVisitor(), seconds * 1000);
  }
}

function showWelcome(message, codeProblem = false) {
  state = null;
  const focus = !firstScreen;
  firstScreen = false;
  const start = h('button', {
    type: 'button',
    class: 'button primary',
    text: t('startButton'),
    onclick: join,
  });
  const screen = h(
    'section',
    { class: 'screen welcome', 'aria-labelledby': 'screen-heading' },
    h('h1', { id: 'screen-heading', text: t('welcomeHeading') }),
    h('p', { class: 'lead', text: t('welcomeText') }),
    h('p', { text: t('welcomeTime') }),
    codeProblem ? null : h('div', { class: 'actions' }, start),
    codeProblem ? h('p', {}, h('a', { href: '/', class: 'button secondary', text: t('backToStart') })) : null,
  );
  mount(screen, focus);
  notify(message);
}

async function join(event) {
  const button = event.currentTarget;
  button.disabled = true;
  const result = await sendReliably('POST', '/api/join', { code: joinCode }, null);
  if (result === null) return;
  if (result.status === 201 || result.status === 200) {
    store.set(tokenKey, result.body.token);
    notify('');
    show(result.body.attempt);
    return;
  }
  button.disabled = false;
  handleResult(result);
}

function consentScreen(current) {
  const answer = (agree) => async (event) => {
    for (const button of root.querySelectorAll('button')) button.disabled = true;
    event.currentTarget.setAttribute('aria-busy', 'true');
    handleResult(await sendReliably('POST', '/api/attempt/consent', { agree }, { step: 'consent' }));
  };
  return h(
    'section',
    { class: 'screen consent', 'aria-labelledby': 'screen-heading' },
    h('h1', { id: 'screen-heading', text: t('consentHeading') }),
    h('p', { class: 'study-title', text: current.study.title }),
    ...current.study.consentText
      .split(/\n{2,}/)
      .filter((paragraph) => paragraph.trim() !== '')
      .map((paragraph) => h('p', { text: paragraph.trim() })),
    h('h2', { text: t('consentQuestion') }),
    h(
      'div',
      { class: 'actions' },
      h('button', { type: 'button', class: 'button primary', text: t('consentYes'), onclick: answer(true) }),
      h('button', {
        type: 'button',
        class: 'button secondary',
        text: t('consentNo'),
        onclick: answer(false),
      }),
    ),
  );
}

function errorLine(id) {
  return h('p', { id, class: 'form-error', role: 'alert', hidden: true });
}

function showError(form, text) {
  const line = form.querySelector('.form-error');
  if (!line) return;
  line.textContent = text;
  line.hidden = text === '';
}

function disableForm(form) {
  for (const control of form.querySelectorAll('button, input, textarea')) control.disabled = true;
  form.setAttribute('aria-busy', 'true');
}

function enableForm() {
  const form = root.querySelector('form');
  if (!form) return;
  for (const control of form.querySelectorAll('button, input, textarea')) control.disabled = false;
  form.setAttribute('aria-busy', 'false');
}

function backgroundScreen(current) {
  const questions = current.background ?? [];
  const form = h('form', { class: 'answer-form', novalidate: true });
  questions.forEach((question, index) => {
    const name = `background-${index}`;
    // "Prefer not to say" is always offered, in the words of the strings file.
    const options = question.options.filter((option) => option.id !== 'prefer-not-to-say');
    options.push({ id: 'prefer-not-to-say', text: t('preferNotToSay') });
    form.append(
      h(
        'fieldset',
        { class: 'question' },
        h('legend', { text: question.prompt }),
        h(
          'div',
          { class: 'options' },
          ...options.map((option, optionIndex) =>
            choice('radio', name, option.id, option.text, `${name}-${optionIndex}`),
          ),
        ),
      ),
    );
  });
  form.append(
    errorLine('background-error'),
    h(
      'div',
      { class: 'actions' },
      h('button', { type: 'submit', class: 'button primary', text: t('continueButton') }),
    ),
  );
  form.addEventListener('submit', async (event) => {
    event.preventDefault();
    const answers = {};
    let missing = false;
    questions.forEach((question, index) => {
      const picked = form.querySelector(`input[name="background-${index}"]:checked`);
      if (picked) answers[question.id] = picked.value;
      else missing = true;
    });
    if (missing) {
      showError(form, t('backgroundMissing'));
      return;
    }
    showError(form, '');
    disableForm(form);
    handleResult(await sendReliably('POST', '/api/attempt/background', { answers }, { step: 'background' }));
  });
  return h(
    'section',
    { class: 'screen background', 'aria-labelledby': 'screen-heading' },
    h('h1', { id: 'screen-heading', text: t('backgroundHeading') }),
    h('p', { text: t('backgroundIntro') }),
    form,
  );
}

/** One large, fully clickable radio button or checkbox with its label. */
function choice(type, name, value, text, id, extra = {}) {
  return h(
    'div',
    { class: `choice ${extra.class ?? ''}`.trim() },
    h('input', { type, name, value, id, 'data-dont-know': extra.dontKnow ? 'true' : undefined }),
    h('label', { for: id, text }),
  );
}

/** The chart as an SVG element, parsed as SVG (never as HTML). */
function chartFigure(svgText) {
  const figure = h('figure', { class: 'chart' });
  const parsed = new DOMParser().parseFromString(svgText, 'image/svg+xml');
  const svg = parsed.documentElement;
  if (svg && svg.namespaceURI === svgNamespace && svg.localName === 'svg') {
    svg.removeAttribute('width');
    svg.removeAttribute('height');
    figure.append(document.importNode(svg, true));
  }
  return figure;
}

/**
 * A chart served as an image (an uploaded chart): fetched with the attempt token and shown from a
 * data: URL, which the page's img-src allows. The image carries the chart's alt text.
 */
function chartImageFigure(image) {
  const img = h('img', { alt: image.alt });
  void loadChartImage(img, image.src, generation);
  return h('figure', { class: 'chart' }, img);
}

async function loadChartImage(img, src, started) {
  for (let attempt = 0; attempt < 5 && started === generation; attempt++) {
    try {
      const token = store.get(tokenKey);
      const response = await fetch(src, {
        headers: token ? { authorization: `Bearer ${token}` } : {},
        cache: 'no-store',
        credentials: 'omit',
      });
      if (response.ok) {
        const reader = new FileReader();
        reader.addEventListener('load', () => {
          if (typeof reader.result === 'string') img.src = reader.result;
        });
        reader.readAsDataURL(await response.blob());
        return;
      }
      if (!isRetryableStatus(response.status)) return;
    } catch {
      // Network trouble: try again below.
    }
    await wait(retryDelay(attempt, Math.random()));
  }
}

function itemScreen(current) {
  const item = current.item;
  const number = Math.min(current.progress.answered + 1, current.progress.total);
  const last = number >= current.progress.total;
  const form = h('form', {
    class: 'answer-form',
    novalidate: true,
    'data-item-id': item.itemId,
    'data-kind': item.responseKind,
  });
  const fieldset = h(
    'fieldset',
    { class: 'question', 'aria-describedby': 'answer-hint' },
    h('legend', { class: 'prompt', text: item.prompt }),
  );
  form.append(fieldset);

  if (item.responseKind === 'single-choice' || item.responseKind === 'multiple-choice') {
    const single = item.responseKind === 'single-choice';
    const type = single ? 'radio' : 'checkbox';
    fieldset.append(
      h('p', { id: 'answer-hint', class: 'hint', text: t(single ? 'chooseOne' : 'chooseAny') }),
      h(
        'div',
        { class: 'options' },
        ...(item.options ?? []).map((option, index) =>
          choice(type, 'answer', option.id, option.text, `option-${index}`),
        ),
        choice(type, 'answer', 'dont-know', t('dontKnow'), 'option-dont-know', {
          dontKnow: true,
          class: 'dont-know',
        }),
      ),
    );
    if (!single) {
      // "I don't know" and real answers exclude each other.
      fieldset.addEventListener('change', (event) => {
        const target = event.target;
        if (!(target instanceof HTMLInputElement) || !target.checked) return;
        for (const box of fieldset.querySelectorAll('input[type="checkbox"]')) {
          if (box !== target && (box.dataset.dontKnow === 'true') !== (target.dataset.dontKnow === 'true')) {
            box.checked = false;
          }
        }
      });
    }
  } else if (item.responseKind === 'numeric') {
    const hasMin = typeof item.min === 'number';
    const hasMax = typeof item.max === 'number';
    const hint =
      hasMin && hasMax
        ? t('numberRange', { min: item.min, max: item.max })
        : hasMin
          ? t('numberAtLeast', { min: item.min })
          : hasMax
            ? t('numberAtMost', { max: item.max })
            : t('numberHint');
    fieldset.append(
      h('p', { id: 'answer-hint', class: 'hint', text: hint }),
      h(
        'div',
        { class: 'number-row' },
        h('label', { for: 'answer-number', text: t('numberLabel') }),
        h(
          'span',
          { class: 'number-input' },
          h('input', {
            id: 'answer-number',
            name: 'number',
            type: 'text',
            inputmode: 'decimal',
            autocomplete: 'off',
            spellcheck: 'false',
            'aria-describedby': 'answer-hint',
          }),
          item.unit ? h('span', { class: 'unit', text: item.unit }) : null,
        ),
      ),
      h(
        'div',
        { class: 'options' },
        choice('checkbox', 'dont-know', 'dont-know', t('dontKnow'), 'option-dont-know', {
          dontKnow: true,
          class: 'dont-know',
        }),
      ),
    );
  } else {
    const maxLength = Number(item.maxLength) || 300;
    fieldset.append(
      h('p', { id: 'answer-hint', class: 'hint', text: t('textHint', { maxLength }) }),
      h('label', { for: 'answer-text', class: 'text-label', text: t('textLabel') }),
      h('textarea', {
        id: 'answer-text',
        name: 'text',
        rows: 4,
        maxlength: maxLength,
        'aria-describedby': 'answer-hint answer-count',
      }),
      // How much room is left, updated as the respondent types; read with the field, not announced per key.
      h('p', { id: 'answer-count', class: 'hint text-count', text: t('textCount', { count: 0, maxLength }) }),
      h(
        'div',
        { class: 'options' },
        choice('checkbox', 'dont-know', 'dont-know', t('dontKnow'), 'option-dont-know', {
          dontKnow: true,
          class: 'dont-know',
        }),
      ),
    );
  }
  const textArea = form.querySelector('#answer-text');
  if (textArea) {
    const count = form.querySelector('#answer-count');
    textArea.addEventListener('input', () => {
      count.textContent = t('textCount', { count: textArea.value.length, maxLength: textArea.maxLength });
    });
  }
  // Typing an answer unticks "I don't know" (number and text questions).
  form.addEventListener('input', (event) => {
    if (event.target instanceof HTMLInputElement && event.target.type !== 'text') return;
    const dontKnow = form.querySelector('input[data-dont-know="true"][type="checkbox"]');
    if (dontKnow && event.target !== dontKnow) dontKnow.checked = false;
  });

  form.append(
    errorLine('answer-error'),
    h(
      'div',
      { class: 'actions' },
      h('button', { type: 'submit', class: 'button primary', text: t(last ? 'finishButton' : 'nextButton') }),
    ),
  );
  form.addEventListener('submit', (event) => {
    event.preventDefault();
    if (saving) return;
    const answer = readAnswer(form, item);
    if (typeof answer === 'string') {
      showError(form, answer);
      return;
    }
    showError(form, '');
    const body = {
      itemId: item.itemId,
      answer,
      clientMs: Math.max(0, Math.round(performance.now() - shownAt)),
    };
    void submitAnswer(form, body);
  });

  return h(
    'section',
    { class: 'screen item', 'aria-labelledby': 'screen-heading' },
    h(
      'div',
      { class: 'progress' },
      h('h1', {
        id: 'screen-heading',
        text: t('progress', { current: number, total: current.progress.total }),
      }),
      h('progress', {
        max: current.progress.total,
        value: current.progress.answered,
        'aria-label': t('progressLabel'),
      }),
    ),
    h(
      'div',
      { class: 'item-layout' },
      item.chartImage ? chartImageFigure(item.chartImage) : chartFigure(item.chartSvg),
      form,
    ),
  );
}

/** The answer in the contract's shape, or the message to show when it is missing or unreadable. */
function readAnswer(form, item) {
  const dontKnow = form.querySelector('input[data-dont-know="true"]:checked');
  if (dontKnow) return { kind: 'dont-know' };
  if (item.responseKind === 'single-choice' || item.responseKind === 'multiple-choice') {
    const optionIds = [...form.querySelectorAll('input[name="answer"]:checked')].map((input) => input.value);
    return optionIds.length === 0 ? t('answerMissing') : { kind: 'choice', optionIds };
  }
  if (item.responseKind === 'numeric') {
    const raw = form.querySelector('#answer-number').value.trim().replace(/\s/g, '').replace(',', '.');
    if (raw === '') return t('answerMissing');
    if (!/^[-+]?(\d+\.?\d*|\.\d+)$/.test(raw)) return t('numberInvalid');
    const value = Number(raw);
    const low = typeof item.min === 'number' ? item.min : Number.NEGATIVE_INFINITY;
    const high = typeof item.max === 'number' ? item.max : Number.POSITIVE_INFINITY;
    if (value < low || value > high)
      return t('numberOutOfRange', { min: item.min ?? '', max: item.max ?? '' });
    return { kind: 'number', value };
  }
  const text = form.querySelector('#answer-text').value.trim();
  if (text === '') return t('answerMissing');
  const maxLength = Number(item.maxLength) || 300;
  if (text.length > maxLength) return t('textTooLong', { maxLength });
  return { kind: 'text', text };
}

async function submitAnswer(form, body) {
  disableForm(form);
  const result = await sendReliably('POST', '/api/attempt/responses', body, {
    step: 'item',
    itemId: body.itemId,
  });
  handleResult(result);
}

/** After a reload: an answer that was never confirmed is sent again, unchanged. */
function resumePending() {
  const pending = readPending();
  if (!pending || state === null) return;
  const sameStep =
    pending.step === state.step && (state.step !== 'item' || state.item?.itemId === pending.itemId);
  if (!sameStep) {
    store.remove(pendingKey);
    return;
  }
  const form = root.querySelector('form');
  if (form) disableForm(form);
  notify(t('saving'));
  void sendReliably(pending.method, pending.path, pending.body, pending).then(handleResult);
}

function endScreen(current) {
  const summary = current.summary
    ? h('p', {
        class: 'summary',
        text: t('endSummary', { answered: current.summary.answered, chartsRead: current.summary.chartsRead }),
      })
    : null;
  return h(
    'section',
    { class: 'screen end', 'aria-labelledby': 'screen-heading' },
    h('h1', { id: 'screen-heading', text: t('endHeading') }),
    h('p', { class: 'lead', text: t('endText') }),
    summary,
    current.study.kiosk ? kioskActions() : null,
  );
}

function declinedScreen(current) {
  return h(
    'section',
    { class: 'screen declined', 'aria-labelledby': 'screen-heading' },
    h('h1', { id: 'screen-heading', text: t('declinedHeading') }),
    h('p', { class: 'lead', text: t('declinedText') }),
    current.study.kiosk ? kioskActions() : null,
  );
}

function kioskActions() {
  return h(
    'div',
    { class: 'actions' },
    h('p', { class: 'hint', text: t('nextVisitorSoon') }),
    h('button', {
      type: 'button',
      class: 'button primary',
      text: t('nextVisitor'),
      onclick: () => void nextVisitor(),
    }),
  );
}

// ---------------------------------------------------------------- start

async function start() {
  if (store.get(tokenKey)) {
    await refresh();
  } else {
    showWelcome('');
  }
}

void start();
