"""solver"""
