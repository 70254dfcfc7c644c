"""Every wait in the browser tests uses the suite's timeout, not Playwright's own 5 s default.

A busy machine once made `expect(...)` calls fail after 5 s while the locator actions around them waited 45 s
(they take the context's default; `expect` has a timeout of its own). This checks the suite's setting on a
self-contained page, without a server.
"""

import pytest
from playwright.sync_api import expect

from tests.browser.conftest import TIMEOUT_MS

pytestmark = pytest.mark.browser


def test_expect_waits_longer_than_playwrights_default(context):
    """A text that appears after 6.5 s is found by a plain `expect`, which would give up at 5 s by default."""
    assert TIMEOUT_MS > 6_500
    page = context.new_page()
    page.set_content(
        "<body><script>setTimeout(() => { const p = document.createElement('p'); "
        "p.textContent = 'late text'; document.body.appendChild(p); }, 6500);</script></body>"
    )
    expect(page.get_by_text("late text")).to_be_visible()
