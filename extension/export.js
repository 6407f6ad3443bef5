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

const KEY_ROW = 16;

// drawKey draws, under the chart, what each outline of the overlay means:
// a sample in each verdict's style (constants.js, from Go) and its words.
function drawKey(ctx, top, dpr, width) {
  const { VERDICTS, INK } = globalThis.standoutConstants;
  ctx.fillStyle = INK.paper;
  ctx.fillRect(0, top, width, (KEY_ROW * VERDICTS.length + 8) * dpr);
  ctx.save();
  ctx.scale(dpr, dpr);
  const y0 = top / dpr + 4;
  VERDICTS.forEach((v, i) => {
    const y = y0 + i * KEY_ROW;
    ctx.strokeStyle = v.colour;
    ctx.lineWidth = v.width;
    ctx.setLineDash(v.dash ? v.dash.split(' ').map(Number) : []);
    ctx.strokeRect(6.5, y + 2.5, 18, 9); // on the pixel grid: a 1 px line stays crisp
    ctx.setLineDash([]);
    ctx.fillStyle = INK.ink;
    ctx.font = '12px system-ui, sans-serif';
    ctx.fillText(v.words, 32, y + 11);
  });
  ctx.restore();
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
    const keyH = KEY_ROW * globalThis.standoutConstants.VERDICTS.length + 8;
    canvas.width = Math.max(1, Math.round(w * dpr));
    canvas.height = Math.max(1, Math.round(h * dpr)) + Math.round(keyH * dpr);
    const ctx = canvas.getContext('2d');
    ctx.drawImage(img, x * dpr, y * dpr, w * dpr, h * dpr, 0, 0, canvas.width, Math.round(h * dpr));
    drawKey(ctx, Math.round(h * dpr), dpr, canvas.width);
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
