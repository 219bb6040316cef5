// Runs in every node test worker before the test files: quiet, fast settings for tests.
process.env.NODE_ENV = 'test';
process.env.LOG_REQUESTS = 'false';
process.env.BCRYPT_COST = '4';
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED = 'true';
process.env.JWT_SECRET = 'test-secret-for-the-test-suite-only-0123456789';
// Generous: many tests sign in from the same loopback address; one test sets its own limit.
process.env.AUTH_RATE_LIMIT = '10000';
process.env.SIGN_UP_RATE_LIMIT = '10000';
