package reports_test

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"
)

// The print check drives Chromium through its DevTools protocol on a pipe
// (--remote-debugging-pipe: commands on file descriptor 3, replies on 4,
// each a JSON message ended by a NUL byte), because the command line
// cannot switch a page to print media. It does what printing does to the
// page: the report is opened at the width of the window Chromium prints
// from, then the viewport takes the width of the printed page (without
// scroll bars, as on paper) and the media becomes print. The charts are
// measured once the page has handled the change to print.

// printWidth is the width of the printed page's content in CSS px: A4,
// 210 mm, less the page margins of 11 mm each side (the @page rule of the
// report, pageRule) is 188 mm, 710.6 px at 96 px to the inch.
const printWidth = 711

// pageRule is the report's page rule that printWidth is computed from.
const pageRule = "@page { size: A4; margin: 10mm 11mm; }"

// printWindow is the window Chromium prints from by default (headless),
// about 800 × 600 px.
const printWindow = "--window-size=800,600"

// devtools is a DevTools protocol connection to one page of a browser.
type devtools struct {
	t       *testing.T
	in      *os.File      // commands to the browser
	out     *bufio.Reader // replies and events from it
	id      int
	session string
}

// call sends method with params and returns the result of its reply; the
// events that come before the reply are skipped.
func (d *devtools) call(method string, params map[string]any) json.RawMessage {
	d.t.Helper()
	d.id++
	msg := map[string]any{"id": d.id, "method": method, "params": params}
	if d.session != "" {
		msg["sessionId"] = d.session
	}
	b, err := json.Marshal(msg)
	if err != nil {
		d.t.Fatal(err)
	}
	if _, err := d.in.Write(append(b, 0)); err != nil {
		d.t.Fatalf("%s: %v", method, err)
	}
	for {
		line, err := d.out.ReadBytes(0)
		if err != nil {
			d.t.Fatalf("%s: no reply from the browser: %v", method, err)
		}
		var reply struct {
			ID     int             `json:"id"`
			Result json.RawMessage `json:"result"`
			Error  *struct {
				Message string `json:"message"`
			} `json:"error"`
		}
		if err := json.Unmarshal(bytes.TrimSuffix(line, []byte{0}), &reply); err != nil {
			d.t.Fatalf("%s: %v", method, err)
		}
		if reply.ID != d.id {
			continue
		}
		if reply.Error != nil {
			d.t.Fatalf("%s: %s", method, reply.Error.Message)
		}
		return reply.Result
	}
}

// eval evaluates a script expression in the page (awaiting it when it is a
// promise) and returns its value, which must be a string.
func (d *devtools) eval(expr string) string {
	d.t.Helper()
	raw := d.call("Runtime.evaluate", map[string]any{"expression": expr, "awaitPromise": true, "returnByValue": true})
	var r struct {
		Result struct {
			Value any `json:"value"`
		} `json:"result"`
		Exception *struct {
			Text string `json:"text"`
		} `json:"exceptionDetails"`
	}
	if err := json.Unmarshal(raw, &r); err != nil {
		d.t.Fatal(err)
	}
	if r.Exception != nil {
		d.t.Fatalf("script %q: %s", expr, r.Exception.Text)
	}
	s, ok := r.Result.Value.(string)
	if !ok {
		d.t.Fatalf("script %q returned %v, not a string", expr, r.Result.Value)
	}
	return s
}

// inBrowser starts the browser with the network disabled and a pipe for
// the protocol, opens a page at url, runs steps on it, closes the browser
// and returns what it logged.
func inBrowser(t *testing.T, bin, url string, steps func(d *devtools)) (logs string) {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 90*time.Second)
	defer cancel()
	cmdR, cmdW, err := os.Pipe()
	if err != nil {
		t.Fatal(err)
	}
	outR, outW, err := os.Pipe()
	if err != nil {
		t.Fatal(err)
	}
	cmd := exec.CommandContext(ctx, bin, "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic",
		"--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync",
		"--disable-default-apps", "--disable-extensions", "--mute-audio",
		"--host-resolver-rules=MAP * ~NOTFOUND", "--user-data-dir="+t.TempDir(),
		"--enable-logging=stderr", "--v=0", "--hide-scrollbars", printWindow, "--remote-debugging-pipe", "about:blank")
	var errOut bytes.Buffer
	cmd.Stderr = &errOut
	cmd.ExtraFiles = []*os.File{cmdR, outW} // descriptors 3 and 4
	if err := cmd.Start(); err != nil {
		t.Fatalf("%s: %v", bin, err)
	}
	cmdR.Close()
	outW.Close()
	d := &devtools{t: t, in: cmdW, out: bufio.NewReader(outR)}
	defer func() {
		cmdW.Close()
		outR.Close()
		_ = cmd.Wait()
	}()
	var target struct {
		TargetID string `json:"targetId"`
	}
	if err := json.Unmarshal(d.call("Target.createTarget", map[string]any{"url": "about:blank"}), &target); err != nil {
		t.Fatal(err)
	}
	var attached struct {
		SessionID string `json:"sessionId"`
	}
	if err := json.Unmarshal(d.call("Target.attachToTarget", map[string]any{"targetId": target.TargetID, "flatten": true}), &attached); err != nil {
		t.Fatal(err)
	}
	d.session = attached.SessionID
	d.call("Page.navigate", map[string]any{"url": url})
	d.eval(`new Promise(function (done) {
  (function wait() { if (document.readyState === "complete") { done("loaded"); } else { setTimeout(wait, 50); } })();
})`)
	steps(d)
	d.session = ""
	d.call("Browser.close", nil)
	_ = cmd.Wait()
	return errOut.String()
}

// checkPrinted lays the page at path out as Chromium prints it and checks
// its charts as checkRendered does on screen: every chart drawn, the wanted
// ones among them, no chart text over another, none cut off at the chart's
// edge, and no console message. Back on screen afterwards, every chart must
// have the layout it had before printing.
func checkPrinted(t *testing.T, bin, path string, want []string) {
	t.Helper()
	raw, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(raw), pageRule) {
		t.Fatalf("the report's page rule is not %q: compute printWidth again", pageRule)
	}
	var js, before, after string
	logs := inBrowser(t, bin, "file://"+filepath.ToSlash(writeProbe(t, path)), func(d *devtools) {
		before = d.eval(layoutJS)
		screen := d.eval(`String(innerWidth)`)
		d.call("Emulation.setDeviceMetricsOverride", map[string]any{
			"width": printWidth, "height": 1000, "deviceScaleFactor": 1, "mobile": false})
		d.eval(waitWidthJS(strconv.Itoa(printWidth)))
		d.eval(mediaChangeJS(true))
		d.call("Emulation.setEmulatedMedia", map[string]any{"media": "print"})
		js = d.eval(`mediaChanged.then(function () {
  return new Promise(function (done) { requestAnimationFrame(function () { done(measureCharts()); }); });
})`)
		// Back to the screen: the window's width, then the media.
		d.call("Emulation.clearDeviceMetricsOverride", nil)
		d.eval(waitWidthJS(screen))
		d.eval(mediaChangeJS(false))
		d.call("Emulation.setEmulatedMedia", map[string]any{"media": ""})
		after = d.eval(`mediaChanged.then(function () {
  return new Promise(function (done) { requestAnimationFrame(function () { done(` + layoutJS + `); }); });
})`)
	})
	checkConsole(t, logs)
	checkCharts(t, fmt.Sprintf("%s in print, %d px wide", filepath.Base(path), printWidth), js, want)
	if after != before {
		t.Errorf("%s: back on screen the charts are not laid out as before printing:\nbefore %s\nafter  %s", filepath.Base(path), before, after)
	}
}

// layoutJS gives the size of every chart's drawing, as JSON.
const layoutJS = `JSON.stringify([].map.call(document.querySelectorAll("div.chart[data-chart] svg"),
  function (s) { return s.getAttribute("width") + "x" + s.getAttribute("height"); }))`

// waitWidthJS waits until the page's viewport is width px wide (a script
// number) and two frames more, so that the page has handled the resize.
func waitWidthJS(width string) string {
	return `new Promise(function (done) {
  (function wait() {
    if (innerWidth !== ` + width + `) { setTimeout(wait, 20); return; }
    requestAnimationFrame(function () { requestAnimationFrame(function () { done("resized"); }); });
  })();
})`
}

// mediaChangeJS sets window.mediaChanged to a promise kept when the print
// media starts (print) or ends. The page's own listener of the print media
// was added before this one, so it has run when this one runs.
func mediaChangeJS(print bool) string {
	return `window.mediaChanged = new Promise(function (done) {
  matchMedia("print").addEventListener("change", function (e) { if (e.matches === ` + strconv.FormatBool(print) + `) { done(); } });
}); "listening"`
}
