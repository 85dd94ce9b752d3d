// Domino shuffling for the (weighted) Aztec diamond: to be written.
#pragma once
