"""The code rules of the design layer, as pure functions of plain numbers (SI, or dimensionless).

- :mod:`engine.design.annex_b`: the equivalent-member check of EN 1993-1-1:2005 §6.3.3, eqs. (6.61) and
  (6.62), with the interaction factors of Annex B (method 2) and the equivalent uniform moment factors of its
  Table B.3;
- :mod:`engine.design.aisc360`: the compression strength of AISC 360-16 §E3 and the interaction of §H1.1,
  eqs. (H1-1a) and (H1-1b);
- :mod:`engine.design.mcr`: the elastic critical moment of lateral-torsional buckling (a finite-element
  solution of Vlasov's equations, numpy only);
- :mod:`engine.design.ltb`: the three-factor M_cr formula and C1 of the standard diagrams, χ_LT of
  EN 1993-1-1 §6.3.2.2/§6.3.2.3, and AISC 360-16 §F2 with C_b of eq. (F1-1).
- :mod:`engine.design.ltb_member`: the member's lateral-torsional buckling check (exact M_cr of its own
  diagram beside the C1 value, χ_LT, M_b,Rd, AISC §F2), which the routes read (issue 15).

These functions take numbers the caller has already checked (the case's validation names the fields a user
typed); they raise ``ValueError`` only for a number outside the range the formula is written for.
"""
