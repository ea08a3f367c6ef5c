NAME          unbounded
ROWS
 N  cost
 L  a
COLUMNS
    x         cost      -1             a         1
    y         cost      -1             a         -1
RHS
    rhs       a         1
ENDATA
