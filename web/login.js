// Shows the failure line after a wrong token (the server redirects to /login?failed).
if (new URLSearchParams(location.search).has('failed')) document.getElementById('failed').hidden = false;
