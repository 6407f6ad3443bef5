// The page that asks the reader to let Standout read frames from other
// origins. A permission can be requested only in a click in an extension
// page; the checked page cannot ask, or see the answer.

const statusLine = document.getElementById('status');
const list = document.getElementById('origins');
const allow = document.getElementById('allow');
const key = location.hash.slice(1);

function say(text, isError) {
  statusLine.textContent = text;
  statusLine.className = isError ? 'error' : '';
}

function send(type, data) {
  return chrome.runtime.sendMessage({ type, data }).then((r) => {
    if (!r || !r.ok) throw new Error((r && r.error) || 'no answer');
    return r.data;
  });
}

let origins = [];
send('standout/take-grant', key)
  .then((os) => {
    origins = os;
    for (const o of os) {
      const li = document.createElement('li');
      li.textContent = o;
      list.appendChild(li);
    }
  })
  .catch((e) => {
    allow.disabled = true;
    say(String(e.message || e), true);
  });

allow.addEventListener('click', async () => {
  if (!origins.length) return;
  let ok;
  try {
    ok = await chrome.permissions.request({ origins: origins.map((o) => o + '/*') });
  } catch (e) {
    say(String(e.message || e), true);
    return;
  }
  if (!ok) {
    say('Not allowed: the frames stay unread.', true);
    return;
  }
  say('Allowed. Checking the page again…');
  try {
    await send('standout/granted', key);
    window.close();
  } catch (e) {
    say(String(e.message || e), true);
  }
});
