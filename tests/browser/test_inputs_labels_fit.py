"""Every label and every shown choice of the inputs column can be read whole (what a person sees).

Found 2026-12-03 on the start page: the Check tab cut "out-of-plane L_cr (empty: L) [m]" after "(empty:",
"buckles (checked)" and "Annex B (method 2)" lost their last letter. For each inputs tab, every visible label
and select of the column must show its whole text: its content is no wider than its box.
"""

import re

import pytest
from playwright.sync_api import expect

pytestmark = pytest.mark.browser

TABS = ("Member", "Section", "Loads", "Bow", "Check")

# Through Bokeh's shadow roots: each visible <label> and <select> in the inputs column (left of x = 330 px)
# whose text is wider than its box: a label wider than its widget (it spills, and the column clips it), a
# select whose shown option is wider than its room (measured on a canvas in its font).
_CUT = """() => {
  const cut = [];
  const canvas = document.createElement('canvas').getContext('2d');
  const walk = (root) => {
    for (const el of root.querySelectorAll('label, select, input')) {
      const box = el.getBoundingClientRect();
      if (box.width === 0 || box.height === 0 || box.left > 330) continue;
      if (el.tagName === 'LABEL') {
        const host = el.parentElement ? el.parentElement.getBoundingClientRect() : box;
        if (el.scrollWidth > el.clientWidth + 1 || box.right > host.right + 1) {
          cut.push('label: ' + el.textContent.trim());
        }
      } else if (el.tagName === 'INPUT') {
        // a number box (a free text, such as the title, may scroll)
        if (el.type !== 'text' || !/^[-+]?[0-9.]+(e[-+]?[0-9]+)?$/i.test(el.value.trim())) continue;
        const style = getComputedStyle(el);
        canvas.font = style.font;
        const room = el.clientWidth - parseFloat(style.paddingLeft) - parseFloat(style.paddingRight);
        if (canvas.measureText(el.value).width > room + 1) cut.push('value: ' + el.value);
      } else {
        const style = getComputedStyle(el);
        canvas.font = style.font;
        const text = el.options[el.selectedIndex] ? el.options[el.selectedIndex].text : '';
        const room = el.clientWidth - parseFloat(style.paddingLeft) - parseFloat(style.paddingRight);
        if (canvas.measureText(text).width > room + 1) cut.push('select: ' + text);
      }
    }
    for (const el of root.querySelectorAll('*')) { if (el.shadowRoot) walk(el.shadowRoot); }
  };
  walk(document);
  return cut;
}"""


# How many labels and selects the inputs column shows (through the shadow roots).
_COUNT = """() => { let count = 0;
  const walk = (root) => { for (const el of root.querySelectorAll('label, select')) {
      const box = el.getBoundingClientRect();
      if (box.width > 0 && box.height > 0 && box.left <= 330) count += 1; }
    for (const el of root.querySelectorAll('*')) { if (el.shadowRoot) walk(el.shadowRoot); } };
  walk(document); return count; }"""


def _drawn(page) -> None:
    """Wait until the shown tab's labels are drawn: some, and the same count twice 300 ms apart (so the check
    never passes on a tab not yet drawn)."""
    last = -1
    for _ in range(100):
        count = page.evaluate(_COUNT)
        if count > 0 and count == last:
            return
        last = count
        page.wait_for_timeout(300)
    raise AssertionError("the inputs tab drew no labels")


@pytest.mark.parametrize("units", ["SI", "US"])
def test_no_label_or_choice_of_the_inputs_is_cut(app, units):
    page = app.page
    if units == "US":
        page.get_by_role("button", name="US", exact=True).click()
        expect(page.get_by_text("Span L [ft]", exact=True)).to_be_visible()
    found = {}
    for name in TABS:
        tab = page.locator(".bk-tab").filter(has_text=name).first
        tab.click()
        expect(tab).to_have_class(re.compile("bk-active"))
        _drawn(page)
        cut = page.evaluate(_CUT)
        if cut:
            found[name] = cut
    assert found == {}
