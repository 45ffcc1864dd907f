/*
 * The payments fake's stand-in for the hosted browser script of the `stripe` packages (served as
 * GET /js/stripe.js). Plain ES2017, no dependencies. It defines window.Stripe before @stripe/stripe-js looks for it, so
 * loadStripe() resolves to this and @stripe/react-stripe-js (Elements, CardElement, useStripe,
 * useElements) works unchanged. What it provides is listed in DEVELOPERS.md ("The payments
 * fake"). The card element renders plain, labelled inputs into the mount node (no iframe); styles
 * are set through the CSSOM only, so a page CSP without 'unsafe-inline' styles keeps working.
 */
(function () {
  'use strict';

  var script = document.currentScript;
  var BASE = (script && script.src ? new URL(script.src).origin : '') || '__PAYMENTS_FAKE_URL__';
  var MESSAGE_SOURCE = 'loamline-payments-fake';

  /* ------------------------------------------------------------------ helpers */

  function formEncode(data, prefix, out) {
    out = out || [];
    Object.keys(data).forEach(function (k) {
      var v = data[k];
      var key = prefix ? prefix + '[' + k + ']' : k;
      if (v === undefined || v === null) return;
      if (typeof v === 'object') formEncode(v, key, out);
      else out.push(encodeURIComponent(key) + '=' + encodeURIComponent(String(v)));
    });
    return out.join('&');
  }

  function intentIdOf(clientSecret) {
    var m = /^(pi_[A-Za-z0-9]+)_secret_/.exec(String(clientSecret || ''));
    return m ? m[1] : null;
  }

  function integrationError(message) {
    var e = new Error(message);
    e.name = 'IntegrationError';
    return e;
  }

  function request(publishableKey, method, path, params) {
    var body = params ? formEncode(params) : '';
    var url = BASE + path + (method === 'GET' && body ? '?' + body : '');
    return fetch(url, {
      method: method,
      headers: Object.assign(
        { Authorization: 'Bearer ' + publishableKey },
        method === 'POST' ? { 'Content-Type': 'application/x-www-form-urlencoded' } : {},
      ),
      body: method === 'POST' ? body : undefined,
      credentials: 'omit',
    }).then(
      function (res) {
        return res.json().then(function (json) {
          return { ok: res.ok, status: res.status, json: json };
        });
      },
      function (err) {
        return {
          ok: false,
          status: 0,
          json: {
            error: {
              type: 'api_connection_error',
              message: 'The payment service could not be reached: ' + err.message,
            },
          },
        };
      },
    );
  }

  function luhn(digits) {
    var sum = 0;
    for (var i = 0; i < digits.length; i++) {
      var d = Number(digits.charAt(digits.length - 1 - i));
      if (i % 2 === 1) {
        d *= 2;
        if (d > 9) d -= 9;
      }
      sum += d;
    }
    return sum % 10 === 0;
  }

  function brandOf(digits) {
    if (/^4/.test(digits)) return 'visa';
    if (/^(5[1-5]|2[2-7])/.test(digits)) return 'mastercard';
    if (/^3[47]/.test(digits)) return 'amex';
    if (/^(6011|65)/.test(digits)) return 'discover';
    return 'unknown';
  }

  function css(el, styles) {
    Object.keys(styles).forEach(function (k) {
      el.style[k] = styles[k];
    });
    return el;
  }

  /* ------------------------------------------------------------------ the card element */

  var ELEMENT_CLASSES = {
    base: 'StripeElement',
    complete: 'StripeElement--complete',
    empty: 'StripeElement--empty',
    focus: 'StripeElement--focus',
    invalid: 'StripeElement--invalid',
    webkitAutofill: 'StripeElement--webkit-autofill',
  };

  var uid = 0;

  function CardElement(group, options) {
    this._group = group;
    this._options = options || {};
    this._handlers = {};
    this._node = null;
    this._root = null;
    this._destroyed = false;
    this._touched = { number: false, expiry: false, cvc: false };
    this._disabled = !!this._options.disabled;
    this._classes = Object.assign({}, ELEMENT_CLASSES, this._options.classes || {});
    this._id = ++uid;
  }

  CardElement.prototype.on = function (event, handler) {
    (this._handlers[event] = this._handlers[event] || []).push(handler);
    return this;
  };
  CardElement.prototype.addEventListener = CardElement.prototype.on;
  CardElement.prototype.once = function (event, handler) {
    var self = this;
    function wrapped(e) {
      self.off(event, wrapped);
      handler(e);
    }
    return this.on(event, wrapped);
  };
  CardElement.prototype.off = function (event, handler) {
    if (!handler) delete this._handlers[event];
    else if (this._handlers[event]) {
      this._handlers[event] = this._handlers[event].filter(function (h) {
        return h !== handler;
      });
    }
    return this;
  };
  CardElement.prototype.removeEventListener = CardElement.prototype.off;
  CardElement.prototype._emit = function (event, payload) {
    (this._handlers[event] || []).slice().forEach(function (h) {
      try {
        h(payload);
      } catch (err) {
        setTimeout(function () {
          throw err;
        });
      }
    });
  };

  CardElement.prototype._check = function () {
    if (this._destroyed)
      throw integrationError('This Element has already been destroyed. Please create a new one.');
  };

  CardElement.prototype.mount = function (target) {
    this._check();
    var node = typeof target === 'string' ? document.querySelector(target) : target;
    if (!node || !node.appendChild)
      throw integrationError(
        'Invalid DOM element. Make sure to call mount() with a valid DOM element or selector.',
      );
    if (this._node) this.unmount();
    this._node = node;
    this._render();
    var self = this;
    setTimeout(function () {
      self._emit('ready', { elementType: 'card' });
    });
    return this;
  };

  CardElement.prototype._render = function () {
    var self = this;
    var style = (this._options.style && this._options.style.base) || {};
    var id = 'loamline-fake-card-' + this._id;
    var root = document.createElement('div');
    root.setAttribute('role', 'group');
    root.setAttribute('aria-label', 'Card details');
    root.setAttribute('data-fake-stripe', 'card');
    css(root, { display: 'flex', flexWrap: 'wrap', gap: '8px', alignItems: 'flex-end' });

    function field(name, label, attrs, width) {
      var wrap = css(document.createElement('div'), {
        display: 'flex',
        flexDirection: 'column',
        flex: width,
      });
      var l = document.createElement('label');
      l.htmlFor = id + '-' + name;
      l.textContent = label;
      css(l, { fontSize: '0.8em', marginBottom: '2px', color: style.color || 'inherit' });
      var input = document.createElement('input');
      input.id = id + '-' + name;
      input.name = 'fake-card-' + name;
      input.type = 'text';
      input.disabled = self._disabled;
      Object.keys(attrs).forEach(function (k) {
        input.setAttribute(k, attrs[k]);
      });
      css(input, {
        font: 'inherit',
        fontSize: style.fontSize || '16px',
        fontFamily: style.fontFamily || 'inherit',
        color: style.color || 'inherit',
        padding: '4px 6px',
        border: '1px solid #8a8a8a',
        borderRadius: '4px',
        minWidth: '0',
        background: 'transparent',
      });
      wrap.appendChild(l);
      wrap.appendChild(input);
      root.appendChild(wrap);
      return input;
    }

    this._number = field(
      'number',
      'Card number',
      {
        inputmode: 'numeric',
        autocomplete: 'cc-number',
        placeholder: '1234 1234 1234 1234',
        maxlength: '23',
      },
      '3 1 12em',
    );
    this._expiry = field(
      'expiry',
      'Expiry (MM / YY)',
      { inputmode: 'numeric', autocomplete: 'cc-exp', placeholder: 'MM / YY', maxlength: '7' },
      '1 1 6em',
    );
    this._cvc = field(
      'cvc',
      'CVC',
      { inputmode: 'numeric', autocomplete: 'cc-csc', placeholder: 'CVC', maxlength: '4' },
      '1 1 4em',
    );

    this._number.addEventListener('input', function () {
      var raw = self._number.value.replace(/\D/g, '');
      var amex = brandOf(raw) === 'amex';
      var digits = raw.slice(0, amex ? 15 : 16);
      self._number.value = amex
        ? [digits.slice(0, 4), digits.slice(4, 10), digits.slice(10, 15)].filter(Boolean).join(' ')
        : (digits.match(/.{1,4}/g) || []).join(' ');
      self._changed('number');
    });
    this._expiry.addEventListener('input', function (e) {
      var digits = self._expiry.value.replace(/\D/g, '').slice(0, 4);
      if (digits.length === 1 && Number(digits) > 1) digits = '0' + digits;
      var deleting = e.inputType && e.inputType.indexOf('delete') === 0;
      self._expiry.value =
        digits.length > 2 || (digits.length === 2 && !deleting)
          ? digits.slice(0, 2) + ' / ' + digits.slice(2)
          : digits;
      self._changed('expiry');
    });
    this._cvc.addEventListener('input', function () {
      self._cvc.value = self._cvc.value.replace(/\D/g, '').slice(0, 4);
      self._changed('cvc');
    });
    [this._number, this._expiry, this._cvc].forEach(function (input) {
      input.addEventListener('blur', function () {
        var name = input === self._number ? 'number' : input === self._expiry ? 'expiry' : 'cvc';
        if (input.value !== '') self._touched[name] = true;
        self._changed(null, true);
      });
    });
    root.addEventListener('focusin', function (e) {
      if (!root.contains(e.relatedTarget)) {
        self._focused = true;
        self._syncClasses();
        self._emit('focus', { elementType: 'card' });
      }
    });
    root.addEventListener('focusout', function (e) {
      if (!root.contains(e.relatedTarget)) {
        self._focused = false;
        self._syncClasses();
        self._emit('blur', { elementType: 'card' });
      }
    });
    root.addEventListener('keydown', function (e) {
      if (e.key === 'Escape') self._emit('escape', { elementType: 'card' });
    });
    this._root = root;
    this._node.appendChild(root);
    this._syncClasses();
  };

  /** The element's state as its change event reports it. */
  CardElement.prototype._state = function (final) {
    var digits = this._number ? this._number.value.replace(/\D/g, '') : '';
    var expiry = this._expiry ? this._expiry.value.replace(/\D/g, '') : '';
    var cvc = this._cvc ? this._cvc.value : '';
    var brand = brandOf(digits);
    var numberLength = brand === 'amex' ? 15 : 16;
    var cvcLength = brand === 'amex' ? 4 : 3;
    var error;
    var touched = this._touched;
    function fail(code, message) {
      if (!error) error = { type: 'validation_error', code: code, message: message };
    }
    if (digits.length >= numberLength && !luhn(digits))
      fail('invalid_number', 'Your card number is invalid.');
    else if (digits.length < numberLength && (touched.number || final))
      fail('incomplete_number', 'Your card number is incomplete.');
    if (expiry.length === 4 || (expiry.length > 0 && (touched.expiry || final))) {
      var month = Number(expiry.slice(0, 2));
      var year = 2000 + Number(expiry.slice(2));
      var now = new Date();
      if (expiry.length < 4) fail('incomplete_expiry', "Your card's expiration date is incomplete.");
      else if (month < 1 || month > 12)
        fail('invalid_expiry_month', "Your card's expiration date is invalid.");
      else if (year < now.getFullYear())
        fail('invalid_expiry_year_past', "Your card's expiration year is in the past.");
      else if (year === now.getFullYear() && month < now.getMonth() + 1) {
        fail('invalid_expiry_month_past', "Your card's expiration date is in the past.");
      }
    } else if (final) fail('incomplete_expiry', "Your card's expiration date is incomplete.");
    if (cvc.length < cvcLength && (touched.cvc || final)) {
      fail('incomplete_cvc', "Your card's security code is incomplete.");
    }
    var complete =
      digits.length === numberLength &&
      luhn(digits) &&
      expiry.length === 4 &&
      cvc.length >= cvcLength &&
      !error;
    return {
      elementType: 'card',
      empty: digits === '' && expiry === '' && cvc === '',
      complete: complete,
      error: error,
      brand: brand,
      value: { postalCode: '' },
      digits: digits,
      expMonth: expiry.slice(0, 2),
      expYear: expiry.slice(2),
      cvc: cvc,
    };
  };

  CardElement.prototype._changed = function (field, fromBlur) {
    var s = this._state(false);
    // Auto-advance, as the hosted element does, once a field is complete and valid.
    if (field === 'number' && s.digits.length === (s.brand === 'amex' ? 15 : 16) && luhn(s.digits))
      this._expiry.focus();
    if (field === 'expiry' && s.expYear.length === 2 && (!s.error || s.error.code.indexOf('expiry') === -1))
      this._cvc.focus();
    var key = JSON.stringify([s.empty, s.complete, s.error && s.error.code, s.brand]);
    this._markInvalid(s.error);
    this._syncClasses(s);
    if (fromBlur && key === this._lastKey) return;
    this._lastKey = key;
    this._emit('change', {
      elementType: 'card',
      empty: s.empty,
      complete: s.complete,
      error: s.error,
      brand: s.brand,
      value: s.value,
    });
  };

  CardElement.prototype._markInvalid = function (error) {
    if (!this._number) return;
    var which = error
      ? /number/.test(error.code)
        ? this._number
        : /expiry/.test(error.code)
          ? this._expiry
          : this._cvc
      : null;
    [this._number, this._expiry, this._cvc].forEach(function (input) {
      if (input === which) input.setAttribute('aria-invalid', 'true');
      else input.removeAttribute('aria-invalid');
    });
  };

  CardElement.prototype._syncClasses = function (state) {
    if (!this._node) return;
    var s = state || this._state(false);
    var c = this._classes;
    var list = this._node.classList;
    list.add(c.base);
    list.toggle(c.empty, s.empty);
    list.toggle(c.complete, s.complete);
    list.toggle(c.invalid, !!s.error);
    list.toggle(c.focus, !!this._focused);
  };

  CardElement.prototype.update = function (options) {
    this._check();
    options = options || {};
    Object.assign(this._options, options);
    if (options.classes) this._classes = Object.assign({}, ELEMENT_CLASSES, this._options.classes);
    if ('disabled' in options) {
      this._disabled = !!options.disabled;
      if (this._number) {
        this._number.disabled = this._expiry.disabled = this._cvc.disabled = this._disabled;
      }
    }
    if (options.style && this._root) {
      var base = options.style.base || {};
      [this._number, this._expiry, this._cvc].forEach(function (input) {
        if (base.color) input.style.color = base.color;
        if (base.fontSize) input.style.fontSize = base.fontSize;
        if (base.fontFamily) input.style.fontFamily = base.fontFamily;
      });
    }
    return this;
  };

  CardElement.prototype.focus = function () {
    this._check();
    if (this._number) this._number.focus();
    return this;
  };
  CardElement.prototype.blur = function () {
    this._check();
    var active = document.activeElement;
    if (this._root && this._root.contains(active)) active.blur();
    return this;
  };
  CardElement.prototype.clear = function () {
    this._check();
    if (!this._number) return this;
    this._number.value = this._expiry.value = this._cvc.value = '';
    this._touched = { number: false, expiry: false, cvc: false };
    this._changed(null);
    return this;
  };
  CardElement.prototype.unmount = function () {
    this._check();
    if (this._root && this._root.parentNode) this._root.parentNode.removeChild(this._root);
    if (this._node) {
      var c = this._classes;
      this._node.classList.remove(c.base, c.empty, c.complete, c.invalid, c.focus);
    }
    this._root = this._node = this._number = this._expiry = this._cvc = null;
    return this;
  };
  CardElement.prototype.destroy = function () {
    if (this._destroyed) return this;
    if (this._node) this.unmount();
    this._destroyed = true;
    this._handlers = {};
    this._group._forget(this);
    return this;
  };

  /* ------------------------------------------------------------------ elements group */

  function Elements(stripe, options) {
    this._stripe = stripe;
    this._options = options || {};
    this._elements = [];
  }
  Elements.prototype.create = function (type, options) {
    if (type !== 'card') {
      throw integrationError('The local payments fake supports only the "card" Element, not "' + type + '".');
    }
    if (this.getElement('card')) {
      throw integrationError('Can only create one Element of type card.');
    }
    var el = new CardElement(this, options);
    this._elements.push(el);
    return el;
  };
  Elements.prototype.getElement = function (typeOrComponent) {
    var type =
      typeof typeOrComponent === 'string'
        ? typeOrComponent
        : typeOrComponent && typeOrComponent.__elementType;
    for (var i = 0; i < this._elements.length; i++)
      if (this._elements[i]._group && type === 'card') return this._elements[i];
    return null;
  };
  Elements.prototype._forget = function (el) {
    this._elements = this._elements.filter(function (e) {
      return e !== el;
    });
  };
  Elements.prototype.update = function (options) {
    Object.assign(this._options, options || {});
    return this;
  };
  Elements.prototype.fetchUpdates = function () {
    return Promise.resolve({});
  };
  Elements.prototype.submit = function () {
    return Promise.resolve({});
  };
  Elements.prototype.on = function () {
    return this;
  };
  Elements.prototype.off = function () {
    return this;
  };

  /* ------------------------------------------------------------------ the authentication step */

  /** Shows the fake's authentication page in a modal frame; resolves once it posts its outcome. */
  function authenticateInModal(url, intentId) {
    return new Promise(function (resolve) {
      var previous = document.activeElement;
      var frameOrigin = new URL(url, window.location.href).origin;
      var overlay = css(document.createElement('div'), {
        position: 'fixed',
        inset: '0',
        zIndex: '2147483647',
        background: 'rgba(0, 0, 0, 0.55)',
        display: 'flex',
        alignItems: 'center',
        justifyContent: 'center',
      });
      overlay.setAttribute('data-fake-stripe', 'authentication');
      var dialog = css(document.createElement('div'), {
        background: '#fff',
        borderRadius: '8px',
        width: 'min(480px, 94vw)',
        height: 'min(440px, 90vh)',
        overflow: 'hidden',
        boxShadow: '0 8px 32px rgba(0, 0, 0, 0.35)',
      });
      dialog.setAttribute('role', 'dialog');
      dialog.setAttribute('aria-modal', 'true');
      dialog.setAttribute('aria-label', 'Test authentication');
      var frame = css(document.createElement('iframe'), { border: '0', width: '100%', height: '100%' });
      frame.title = 'Test authentication';
      frame.src = url;
      dialog.appendChild(frame);
      overlay.appendChild(dialog);
      // modal for the keyboard too: the page behind is inert while the overlay is up, so Tab
      // cannot leave the frame for buttons the rider cannot see
      var madeInert = Array.prototype.filter.call(document.body.children, function (el) {
        return !el.hasAttribute('inert');
      });
      madeInert.forEach(function (el) {
        el.setAttribute('inert', '');
      });
      document.body.appendChild(overlay);
      frame.addEventListener('load', function () {
        frame.focus();
      });
      function onMessage(e) {
        if (e.origin !== frameOrigin || e.source !== frame.contentWindow) return;
        var data = e.data || {};
        if (
          data.source !== MESSAGE_SOURCE ||
          data.type !== 'authentication-result' ||
          data.paymentIntent !== intentId
        )
          return;
        window.removeEventListener('message', onMessage);
        if (overlay.parentNode) overlay.parentNode.removeChild(overlay);
        madeInert.forEach(function (el) {
          el.removeAttribute('inert');
        });
        if (previous && previous.focus) previous.focus();
        resolve(data.outcome);
      }
      window.addEventListener('message', onMessage);
    });
  }

  /* ------------------------------------------------------------------ the object window.Stripe() returns */

  function Stripe(publishableKey, options) {
    if (typeof publishableKey !== 'string' || publishableKey === '') {
      throw integrationError('Please call Stripe() with your publishable key. You used an empty string.');
    }
    if (/^sk_/.test(publishableKey)) {
      throw integrationError(
        'You should not use your secret key with Stripe.js. Please pass a publishable key instead.',
      );
    }
    var key = publishableKey;
    var wrappers = [];
    var appInfo = null;

    function errorResult(json) {
      return {
        error: (json && json.error) || {
          type: 'api_error',
          message: 'Unexpected answer from the payment service.',
        },
      };
    }

    function retrieve(clientSecret) {
      var id = intentIdOf(clientSecret);
      if (!id)
        return Promise.reject(
          integrationError(
            'Invalid value for retrievePaymentIntent: clientSecret should be a client secret of the form ${id}_secret_${secret}.',
          ),
        );
      return request(key, 'GET', '/v1/payment_intents/' + id, { client_secret: clientSecret }).then(
        function (r) {
          return r.ok ? { paymentIntent: r.json } : errorResult(r.json);
        },
      );
    }

    /** After confirming: an intent that needs authentication gets the modal, then its final state. */
    function settle(pi, clientSecret, handleActions) {
      if (pi.status !== 'requires_action' || !pi.next_action || pi.next_action.type !== 'redirect_to_url') {
        return Promise.resolve({ paymentIntent: pi });
      }
      if (handleActions === false) return Promise.resolve({ paymentIntent: pi });
      return authenticateInModal(pi.next_action.redirect_to_url.url, pi.id).then(function () {
        return retrieve(clientSecret).then(function (r) {
          if (r.error) return r;
          var after = r.paymentIntent;
          if (after.status === 'requires_payment_method' && after.last_payment_error) {
            return { error: Object.assign({}, after.last_payment_error, { payment_intent: after }) };
          }
          return { paymentIntent: after };
        });
      });
    }

    function cardData(card) {
      var s = card._state(true);
      if (s.error) return { error: s.error };
      return {
        data: {
          type: 'card',
          card: { number: s.digits, exp_month: s.expMonth, exp_year: s.expYear, cvc: s.cvc },
        },
      };
    }

    function confirmCardPayment(clientSecret, data, options) {
      var id = intentIdOf(clientSecret);
      if (!id) {
        return Promise.reject(
          integrationError(
            'Invalid value for confirmCardPayment: clientSecret should be a client secret of the form ${id}_secret_${secret}.',
          ),
        );
      }
      data = data || {};
      options = options || {};
      var params = { client_secret: clientSecret };
      var pm = data.payment_method;
      if (typeof pm === 'string') params.payment_method = pm;
      else if (pm && (pm instanceof CardElement || pm.card instanceof CardElement)) {
        var card = pm instanceof CardElement ? pm : pm.card;
        if (card._destroyed || !card._number) {
          return Promise.reject(
            integrationError('The card Element passed to confirmCardPayment is not mounted.'),
          );
        }
        var built = cardData(card);
        if (built.error) return Promise.resolve({ error: built.error });
        params.payment_method_data = built.data;
        if (pm.billing_details) params.payment_method_data.billing_details = pm.billing_details;
      } else if (pm) {
        return Promise.reject(
          integrationError(
            'payment_method should be a card Element, { card: Element } or a PaymentMethod id.',
          ),
        );
      }
      if (data.return_url) params.return_url = data.return_url;
      return request(key, 'POST', '/v1/payment_intents/' + id + '/confirm', params).then(function (r) {
        if (!r.ok) return errorResult(r.json);
        return settle(r.json, clientSecret, options.handleActions);
      });
    }

    function handleNextAction(clientSecret) {
      return retrieve(clientSecret).then(function (r) {
        if (r.error) return r;
        return settle(r.paymentIntent, clientSecret, true);
      });
    }

    function unsupported(name) {
      return function () {
        return Promise.resolve({
          error: {
            type: 'invalid_request_error',
            message: 'The local payments fake does not support ' + name + '().',
          },
        });
      };
    }

    return {
      _fake: true,
      _apiBase: BASE,
      _wrappers: wrappers,
      _options: options || {},
      elements: function (opts) {
        return new Elements(this, opts);
      },
      confirmCardPayment: confirmCardPayment,
      retrievePaymentIntent: retrieve,
      handleCardAction: handleNextAction,
      handleNextAction: function (opts) {
        return handleNextAction(opts && opts.clientSecret);
      },
      createToken: unsupported('createToken'),
      createPaymentMethod: unsupported('createPaymentMethod'),
      createSource: unsupported('createSource'),
      retrieveSource: unsupported('retrieveSource'),
      confirmPayment: unsupported('confirmPayment'),
      confirmSetup: unsupported('confirmSetup'),
      confirmCardSetup: unsupported('confirmCardSetup'),
      retrieveSetupIntent: unsupported('retrieveSetupIntent'),
      createConfirmationToken: unsupported('createConfirmationToken'),
      verifyMicrodepositsForPayment: unsupported('verifyMicrodepositsForPayment'),
      paymentRequest: function () {
        throw integrationError('The local payments fake does not support paymentRequest().');
      },
      registerAppInfo: function (info) {
        appInfo = info;
        this._appInfo = appInfo;
      },
      _registerWrapper: function (wrapper) {
        wrappers.push(wrapper);
      },
    };
  }

  Stripe.version = 'endive';
  Stripe.fake = true;
  window.Stripe = Stripe;
})();
