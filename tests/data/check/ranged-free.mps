NAME          RANGEDFREE
ROWS
 N  cost
 E  e1
 G  g1
COLUMNS
    x         cost      1              e1        1
    x         g1        1
    y         cost      2              e1        1
    y         g1        -1
RHS
    rhs       cost      -5             e1        4
    rhs       g1        1
RANGES
    rng       g1        1
BOUNDS
 FR bnd       x
 UP bnd       y         10
ENDATA
