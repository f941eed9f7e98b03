// Test-wide patience for screens that load lazily: the findBy*/waitFor of Testing Library wait up
// to 10 s (the default 1 s was not enough when the 2-core machine ran other test files beside a
// client test and a lazily loaded screen took longer to import). A test that never finds what it
// looks for still fails; it only waits longer before it does.
import { configure } from '@testing-library/dom';

configure({ asyncUtilTimeout: 10_000 });
