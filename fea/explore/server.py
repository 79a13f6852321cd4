"""The explorer's local web server: the page, its script, and a small JSON interface to the state.

Security model (``docs/explorer.md``):

* it listens on the loopback address ``127.0.0.1`` only;
* every request must name the server itself in ``Host`` (``127.0.0.1:PORT``
  or ``localhost:PORT``), so a page of another site whose name has been
  pointed at 127.0.0.1 (DNS rebinding) is refused; an ``Origin`` header, when
  sent, must be the page's own origin, and a browser's ``Sec-Fetch-Site:
  cross-site`` is refused;
* every request must start its path with the random token printed on the
  command line (``/TOKEN/...``); anything else gets 403 and no hint;
* the page never names a file: the server reads only the case given on the
  command line (already in memory) and its own static files, and writes only
  a save *name* in the case's folder (:mod:`fea.explore.save`);
* the page may load nothing from elsewhere: its Content-Security-Policy allows
  only its own script and style, and ``connect-src 'self'``;
* the server stops on Ctrl-C and after an idle time without requests.

Built on :class:`http.server.ThreadingHTTPServer`.  Changes of the state are
serialised by one lock; the slow "all analyses" step runs outside it, so the
sliders stay quick while it works.  Nothing here prints: the command module
(:mod:`fea.cli.explore`) reports the address and the stop.
"""

from __future__ import annotations

import json
import logging
import secrets
import socket
import threading
import time
from http.server import BaseHTTPRequestHandler, ThreadingHTTPServer
from pathlib import Path
from typing import Any
from urllib.parse import urlsplit

from ..errors import FeaError
from ..pipeline import run_case
from .save import Saver
from .state import Explorer, Outcome, values_in_display
from .view import outcome_view, page_state

__all__ = ["ExploreServer", "HOST", "MAX_BODY", "IDLE_TIMEOUT", "CSP"]

logger = logging.getLogger(__name__)

#: The only address the server listens on.
HOST = "127.0.0.1"
#: Largest request body accepted [bytes].
MAX_BODY = 64 * 1024
#: Default idle time after which the server stops [s].
IDLE_TIMEOUT = 30 * 60.0
#: What the page may load: its own script and style, and requests to its own origin; nothing else.
CSP = ("default-src 'none'; script-src 'self'; style-src 'self'; img-src 'self' data:; connect-src 'self'; "
       "base-uri 'none'; form-action 'none'; frame-ancestors 'none'")
STATIC = Path(__file__).with_name("static")
_FILES = {"": ("index.html", "text/html; charset=utf-8"), "app.js": ("app.js", "text/javascript; charset=utf-8"),
          "app.css": ("app.css", "text/css; charset=utf-8")}


class ExploreServer:
    """The server of one explorer session.

    Parameters
    ----------
    explorer : the state (a case and its sliders)
    port : TCP port on 127.0.0.1 (0: any free port)
    idle_timeout : seconds without a request after which :meth:`wait` returns
    token : the secret path prefix (default: 32 random bytes, URL-safe)
    """

    def __init__(self, explorer: Explorer, port: int = 0, idle_timeout: float = IDLE_TIMEOUT,
                 token: str | None = None) -> None:
        self.explorer = explorer
        self.saver = Saver(explorer)
        self.token = token or secrets.token_urlsafe(32)
        self.lock = threading.Lock()
        self.idle_timeout = float(idle_timeout)
        self.last_request = time.monotonic()
        self.httpd = _Server((HOST, int(port)), _Handler)
        self.httpd.daemon_threads = True
        self.httpd.app = self  # type: ignore[attr-defined]
        self.port = int(self.httpd.server_address[1])
        self.hosts = {f"127.0.0.1:{self.port}", f"localhost:{self.port}"}
        self.origins = {f"http://{h}" for h in self.hosts}
        self._thread: threading.Thread | None = None
        self._static = {name: (STATIC.joinpath(f).read_bytes(), ctype) for name, (f, ctype) in _FILES.items()}

    @property
    def address(self) -> tuple[str, int]:
        return self.httpd.server_address[0], self.port

    @property
    def url(self) -> str:
        return f"http://127.0.0.1:{self.port}/{self.token}/"

    def start(self) -> "ExploreServer":
        """Serve in a background thread."""
        self._thread = threading.Thread(target=self.httpd.serve_forever, kwargs={"poll_interval": 0.2},
                                        name="stanchion-explore", daemon=True)
        self._thread.start()
        return self

    def wait(self, poll: float = 0.5) -> str:
        """Block until the idle time has passed without a request; returns ``"idle"``.  Ctrl-C
        (:class:`KeyboardInterrupt`) passes through to the caller, which then calls :meth:`stop`."""
        while True:
            left = self.idle_timeout - (time.monotonic() - self.last_request)
            if left <= 0:
                return "idle"
            time.sleep(min(poll, left))

    def stop(self) -> None:
        """Stop serving and close the socket (waits for the serving thread)."""
        self.httpd.shutdown()
        self.httpd.server_close()
        if self._thread is not None:
            self._thread.join(timeout=5.0)

    def __enter__(self) -> "ExploreServer":
        return self.start()

    def __exit__(self, *exc) -> None:
        self.stop()

    # -- the interface ----------------------------------------------------------------------------------------
    def static(self, name: str) -> tuple[bytes, str] | None:
        return self._static.get(name)

    def state(self) -> dict[str, Any]:
        with self.lock:
            ex = self.explorer
            return page_state(ex, ex.preview(None))

    def set(self, body: dict) -> dict[str, Any]:
        with self.lock:
            ex = self.explorer
            key = body.get("key")
            if "pos" in body:
                ex.set_position(key, body["pos"])
            elif "text" in body:
                ex.set_text(key, body["text"])
            else:
                raise FeaError("expected 'pos' or 'text' with the slider's 'key'")
            return self._view(ex.preview(key))

    def prepare(self, body: dict) -> dict[str, Any]:
        with self.lock:
            t0 = time.perf_counter()
            self.explorer.prepare(body.get("key"))
            return {"ok": True, "server_ms": round(1e3 * (time.perf_counter() - t0), 3)}

    def reset(self) -> dict[str, Any]:
        with self.lock:
            self.explorer.reset()
            return self._view(self.explorer.preview(None))

    def settle(self) -> dict[str, Any]:
        """Every analysis for the present values (the slow part runs outside the lock)."""
        with self.lock:
            ov, rev, ready = self.explorer.full_started()
            if isinstance(ready, Outcome):
                return self._view(ready)
        t0 = time.perf_counter()
        try:
            res: Any = run_case(ready)
        except FeaError as exc:
            res = exc
        seconds = time.perf_counter() - t0
        with self.lock:
            return self._view(self.explorer.full_finished(ov, rev, res, seconds))

    def save(self, body: dict) -> dict[str, Any]:
        with self.lock:
            return self.saver.save(body.get("name"), overwrite=bool(body.get("overwrite")),
                                   confirm=body.get("confirm"))

    def _view(self, out: Outcome) -> dict[str, Any]:
        data = outcome_view(self.explorer, out)
        data["current_rev"] = self.explorer.rev
        data["values"] = values_in_display(self.explorer)
        return data


class _Server(ThreadingHTTPServer):
    """The HTTP server; a connection the browser drops (a closed tab, a reset) is logged, never printed."""

    daemon_threads = True

    def handle_error(self, request, client_address) -> None:
        logger.debug("explore: connection from %s ended with an error", client_address, exc_info=True)


class _Handler(BaseHTTPRequestHandler):
    server_version = "stanchion-explore"
    sys_version = ""
    protocol_version = "HTTP/1.1"

    @property
    def app(self) -> ExploreServer:
        return self.server.app  # type: ignore[attr-defined]

    def setup(self) -> None:
        super().setup()
        # answers are small and sent in one piece: no waiting for the client's acknowledgement (Nagle)
        self.connection.setsockopt(socket.IPPROTO_TCP, socket.TCP_NODELAY, 1)

    def log_message(self, format: str, *args: Any) -> None:  # noqa: A002 - the base class's name
        logger.debug("%s %s", self.address_string(), format % args)

    # -- answers ---------------------------------------------------------------------------------------------
    def _send(self, code: int, body: bytes, ctype: str) -> None:
        self.send_response(code)
        self.send_header("Content-Type", ctype)
        self.send_header("Content-Length", str(len(body)))
        self.send_header("Cache-Control", "no-store")
        self.send_header("X-Content-Type-Options", "nosniff")
        self.send_header("Referrer-Policy", "no-referrer")
        self.send_header("X-Frame-Options", "DENY")
        self.send_header("Cross-Origin-Resource-Policy", "same-origin")
        if ctype.startswith("text/html"):
            self.send_header("Content-Security-Policy", CSP)
        # the head and the body in one write (end_headers would send the head alone)
        self._headers_buffer.append(b"\r\n")  # type: ignore[attr-defined]
        if self.command != "HEAD":
            self._headers_buffer.append(body)  # type: ignore[attr-defined]
        self.flush_headers()

    def _json(self, code: int, data: Any) -> None:
        self._send(code, json.dumps(data, allow_nan=False).encode("utf-8"), "application/json; charset=utf-8")

    def _refuse(self, code: int = 403, text: str = "forbidden") -> None:
        self.close_connection = True
        self._send(code, text.encode("utf-8") + b"\n", "text/plain; charset=utf-8")

    # -- the checks ------------------------------------------------------------------------------------------
    def _route(self) -> str | None:
        """The path after the token, or None after refusing the request (403)."""
        app = self.app
        host = self.headers.get("Host", "")
        origin = self.headers.get("Origin")
        site = self.headers.get("Sec-Fetch-Site")
        if host not in app.hosts or (origin is not None and origin not in app.origins) or site == "cross-site":
            self._refuse()
            return None
        path = urlsplit(self.path).path
        parts = path.split("/", 2)  # "", token, rest
        if len(parts) < 2 or not secrets.compare_digest(parts[1].encode(), app.token.encode()):
            self._refuse()
            return None
        app.last_request = time.monotonic()
        return parts[2] if len(parts) > 2 else ""

    # -- methods ---------------------------------------------------------------------------------------------
    def do_GET(self) -> None:  # noqa: N802 - the base class's name
        rest = self._route()
        if rest is None:
            return
        if rest == "api/state":
            return self._call(self.app.state)
        found = self.app.static(rest)
        if found is None:
            return self._refuse(404, "not found")
        self._send(200, *found)

    do_HEAD = do_GET

    def do_POST(self) -> None:  # noqa: N802
        rest = self._route()
        if rest is None:
            return
        handlers = {"api/set": self.app.set, "api/prepare": self.app.prepare, "api/save": self.app.save,
                    "api/reset": lambda body: self.app.reset(), "api/settle": lambda body: self.app.settle()}
        if rest not in handlers:
            return self._refuse(404, "not found")
        if not self.headers.get("Content-Type", "").startswith("application/json"):
            return self._refuse(415, "expected application/json")
        try:
            n = int(self.headers.get("Content-Length", "0"))
        except ValueError:
            n = -1
        if not 0 <= n <= MAX_BODY:
            return self._refuse(413, "request too large")
        try:
            body = json.loads(self.rfile.read(n) or b"{}")
        except (ValueError, UnicodeDecodeError):
            return self._json(400, {"error": "the request is not JSON"})
        if not isinstance(body, dict):
            return self._json(400, {"error": "expected a JSON object"})
        self._call(lambda: handlers[rest](body))

    def _call(self, fn) -> None:
        try:
            data = fn()
        except FeaError as exc:
            return self._json(400, {"error": str(exc)})
        except Exception as exc:  # a bug: say so on the page, keep serving
            logger.exception("explore: internal error")
            return self._json(500, {"error": f"internal error: {type(exc).__name__}: {exc}"})
        self._json(200, data)

    def _other(self) -> None:
        if self._route() is not None:
            self._refuse(405, "method not allowed")

    do_PUT = do_DELETE = do_PATCH = do_OPTIONS = _other
