// Signs in from a link whose fragment carries the token (#token=…): the fragment never reaches the
// server or its logs; it is removed from the address bar and posted to /sign-in like a typed token.
(() => {
  const match = /(?:^#|&)token=([^&]+)/.exec(window.location.hash);
  if (!match) return;
  history.replaceState(null, '', window.location.pathname + window.location.search);
  const form = document.getElementById('sign-in');
  const field = document.getElementById('token');
  if (!form || !field) return;
  field.value = decodeURIComponent(match[1]);
  form.submit();
})();
