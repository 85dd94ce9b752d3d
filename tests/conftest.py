import sys
from pathlib import Path

from hypothesis import settings

# Shared 2-core machines make hypothesis deadlines flaky; examples are fixed by the profile.
settings.register_profile("frostline", deadline=None, max_examples=60, derandomize=True)
settings.load_profile("frostline")

sys.path.insert(0, str(Path(__file__).parent))
