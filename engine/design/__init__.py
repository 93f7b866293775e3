"""Design from demand: from Mu to bar options that meet every rule (`sizing.design_section`).

`arrangement` places bars in one or two layers and gives their real d and
dt; `sizing` finds the least As for Mu and, for each bar size, the fewest
bars that fit and pass the checks of `provisions`. Imports only from
`provisions`, `mechanics`, `section` and itself.
"""
