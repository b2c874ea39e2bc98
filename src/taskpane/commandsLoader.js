// The ribbon's FunctionFile (commands.html) registers no function: the button only opens the
// task pane (ShowTaskpane). office.js must still start; a file of its own so that the page's
// Content-Security-Policy needs no inline script.
if (window.Office && window.Office.onReady) window.Office.onReady();
