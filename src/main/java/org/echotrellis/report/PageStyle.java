package org.echotrellis.report;

/**
 * The inline style sheet and script of every report page. Colours: dark ink on a warm off-white
 * page (contrast ratio above 12:1), links and focus in the chart palette's ink blue. The print
 * rules fit figures to the page width of A4 and Letter, keep a figure, a table row and a montage
 * tile on one page, and hide the interactive controls. The script only adds: a slice slider per
 * montage (showing one slice enlarged; without the script every slice stays visible) and
 * click-to-sort table headers.
 */
final class PageStyle {
    private PageStyle() { }

    static final String CSS = """
            :root { color-scheme: light; }
            body { margin: 0; background: #fbfaf6; color: #222; font: 15px/1.45 system-ui, -apple-system, "Segoe UI", \
            Roboto, "Helvetica Neue", Arial, sans-serif; }
            main { max-width: 1100px; margin: 0 auto; padding: 16px 24px 48px; }
            h1 { font-size: 1.6em; margin: 0.4em 0 0.2em; }
            h2 { font-size: 1.3em; border-bottom: 1px solid #d9d6cc; padding-bottom: 3px; margin-top: 1.6em; }
            h3 { font-size: 1.1em; margin-top: 1.2em; }
            h4 { font-size: 1em; margin-top: 1em; }
            .sub { color: #444; margin: 0.2em 0; }
            pre { background: #f1efe8; padding: 8px 10px; overflow-x: auto; white-space: pre-wrap; word-break: break-all; \
            font-size: 13px; }
            table { border-collapse: collapse; margin: 8px 0 12px; font-size: 14px; }
            th, td { border: 1px solid #d9d6cc; padding: 3px 8px; text-align: left; vertical-align: top; }
            td.n { text-align: right; font-variant-numeric: tabular-nums; }
            table.facts th { background: #f1efe8; font-weight: 600; }
            table.data thead th { background: #e8e4d8; }
            table.sortable th[aria-sort] { text-decoration: underline; }
            caption { text-align: left; font-weight: 600; padding: 2px 0; }
            .scroll { overflow-x: auto; }
            td.hash { font-family: ui-monospace, monospace; font-size: 12px; word-break: break-all; }
            figure { margin: 10px 0 16px; }
            figure.chart svg { width: 100%; max-width: 760px; height: auto; display: block; }
            figcaption { font-size: 13px; color: #444; }
            .caution { border-left: 5px solid #9e2b25; background: #f7e9e4; padding: 8px 12px; }
            .montage { display: flex; flex-wrap: wrap; gap: 4px; align-items: flex-start; }
            .tile { margin: 0; background: #333; }
            .tile img { display: block; image-rendering: pixelated; }
            .tile figcaption { color: #eee; font-size: 11px; padding: 0 3px; }
            .montage.single .tile { display: none; }
            .montage.single .tile.on { display: block; }
            .montage.single .tile.on img { width: min(100%, 560px) !important; height: auto !important; }
            .slider { display: flex; gap: 10px; align-items: center; margin: 4px 0; font-size: 14px; }
            .bar { display: block; margin: 4px 0 8px; }
            .mapblock { margin-bottom: 18px; }
            @media print {
              @page { margin: 12mm; }
              body { background: #fff; font-size: 11pt; }
              main { max-width: none; padding: 0; }
              .slider { display: none; }
              .montage.single .tile { display: block; }
              .montage.single .tile img { width: auto !important; }
              figure, .tile, tr, .caution, table.facts { break-inside: avoid; page-break-inside: avoid; }
              h2, h3, h4 { break-after: avoid; page-break-after: avoid; }
              figure.chart svg, figure.chart img, .tile img { max-width: 100% !important; }
              .scroll { overflow: visible; }
              details > pre { display: block; }
              a { color: inherit; }
            }
            """;

    static final String SCRIPT = """
            (function () {
              document.querySelectorAll('.montage').forEach(function (m) {
                var tiles = m.querySelectorAll('.tile');
                if (tiles.length < 2) { return; }
                var box = document.createElement('div');
                box.className = 'slider';
                var label = document.createElement('label');
                var input = document.createElement('input');
                input.type = 'range'; input.min = 0; input.max = tiles.length - 1; input.value = 0;
                var all = document.createElement('button');
                all.type = 'button'; all.textContent = 'all slices';
                var text = document.createElement('span');
                label.textContent = 'slice ';
                label.appendChild(input);
                box.appendChild(label); box.appendChild(text); box.appendChild(all);
                m.parentNode.insertBefore(box, m);
                function show(i) {
                  tiles.forEach(function (t, k) { t.classList.toggle('on', k === i); });
                  m.classList.add('single');
                  text.textContent = tiles[i].querySelector('figcaption').textContent;
                }
                input.addEventListener('input', function () { show(parseInt(input.value, 10)); });
                all.addEventListener('click', function () { m.classList.remove('single'); text.textContent = ''; });
              });
              document.querySelectorAll('table.sortable').forEach(function (t) {
                var heads = t.tHead ? t.tHead.rows[0].cells : [];
                Array.prototype.forEach.call(heads, function (th, col) {
                  th.tabIndex = 0;
                  th.title = 'sort';
                  function sort() {
                    var asc = th.getAttribute('aria-sort') !== 'ascending';
                    Array.prototype.forEach.call(heads, function (h) { h.removeAttribute('aria-sort'); });
                    th.setAttribute('aria-sort', asc ? 'ascending' : 'descending');
                    var body = t.tBodies[0];
                    var rows = Array.prototype.slice.call(body.rows);
                    rows.sort(function (a, b) {
                      var x = a.cells[col], y = b.cells[col];
                      var u = x && x.dataset.v !== undefined ? parseFloat(x.dataset.v) : NaN;
                      var v = y && y.dataset.v !== undefined ? parseFloat(y.dataset.v) : NaN;
                      var c = (!isNaN(u) && !isNaN(v)) ? u - v
                          : (x ? x.textContent : '').localeCompare(y ? y.textContent : '');
                      return asc ? c : -c;
                    });
                    rows.forEach(function (r) { body.appendChild(r); });
                  }
                  th.addEventListener('click', sort);
                  th.addEventListener('keydown', function (e) { if (e.key === 'Enter') { sort(); } });
                });
              });
            })();
            """;
}
