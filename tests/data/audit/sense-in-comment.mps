*SENSE:Maximize
* Invented test model: earn 3 per unit of X and 2 per unit of Y, at most 4 units in all and at
* most 3 of X.  The sense above is only a comment, as some modelling layers write it; there is no
* OBJSENSE section, so the file as written is a minimisation (optimum 0); maximised it earns 11.
NAME EARN
ROWS
 N EARN
 L ROOM
COLUMNS
 X EARN 3 ROOM 1
 Y EARN 2 ROOM 1
RHS
 RHS ROOM 4
BOUNDS
 UP BND X 3
ENDATA
