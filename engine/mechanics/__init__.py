"""The mechanics: forces in the section for a strain profile, and the neutral axis that balances them.

Plane sections, the equivalent rectangular block and its force balance
(`stress_block`, `equilibrium`), the nonlinear section response that
moment–curvature integrates (`section_response`), the gross section and its
cracking moment (`cracking`), and the one bracketed root finder the searches
share (`root_finding`). Nothing here knows φ or a code limit: those are
`provisions`, one layer up. Imports only from `section` and from itself.
"""
