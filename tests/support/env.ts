// Runs in every node test worker before the test files: quiet, fast settings for tests.
process.env.NODE_ENV = 'test';
process.env.LOG_REQUESTS = 'false';
process.env.BCRYPT_COST = '4';
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED = 'true';
