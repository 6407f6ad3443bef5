// The PNG export's own page. It takes the tab's screenshot from the
// background, cuts it to each chart's box and offers each as a file. It
// runs in the extension's origin, so neither the screenshot nor the files
// are ever readable by the page that was checked.

const statusLine = document.getElementById('status');
const list = document.getElementById('charts');

function say(text, isError) {
  statusLine.textContent = text;
  statusLine.className = isError ? 'error' : '';
}

async function main() {
  const key = location.hash.slice(1);
  const resp = await chrome.runtime.sendMessage({ type: 'standout/take-export', target: 'background', data: key });
  if (!resp || !resp.ok) {
    say((resp && resp.error) || 'the screenshot is not available', true);
    return;
  }
  const { url, charts, viewport } = resp.data;
  const img = new Image();
  img.src = url;
  await img.decode();
  const dpr = img.width / viewport[0];
  let n = 0;
  for (const c of charts) {
    const [x, y, w, h] = c.box;
    const canvas = document.createElement('canvas');
    canvas.width = Math.max(1, Math.round(w * dpr));
    canvas.height = Math.max(1, Math.round(h * dpr));
    canvas.getContext('2d').drawImage(img, x * dpr, y * dpr, w * dpr, h * dpr, 0, 0, canvas.width, canvas.height);
    const blob = await new Promise((r) => canvas.toBlob(r, 'image/png'));
    const href = URL.createObjectURL(blob);
    const fig = document.createElement('figure');
    const pic = document.createElement('img');
    pic.src = href;
    pic.alt = `${c.name}: the chart with Standout's outlines`;
    const cap = document.createElement('figcaption');
    const a = document.createElement('a');
    a.href = href;
    a.download = c.name;
    a.textContent = `Download ${c.name}`;
    cap.appendChild(a);
    fig.append(pic, cap);
    list.appendChild(fig);
    a.click();
    n++;
  }
  say(n ? `${n} chart${n === 1 ? '' : 's'} exported as PNG.` : 'No chart was in view: scroll to a chart and export again.', n === 0);
  document.body.setAttribute('data-state', 'done');
}

main().catch((e) => say(String((e && e.message) || e), true));
